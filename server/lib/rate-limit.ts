import type { EntityManager } from '@mikro-orm/postgresql';
import { AppError } from './errors';

export interface RateRule {
  /** Most hits allowed in one window. */
  limit: number;
  windowSeconds: number;
}

/**
 * Fixed-window counter kept in PostgreSQL, so every app instance behind a load balancer shares
 * it. Counts the hit and throws 429 (with the seconds to wait) when the window is full.
 */
export async function hitRateLimit(em: EntityManager, key: string, rule: RateRule, message: string): Promise<void> {
  const rows = (await em.getConnection().execute(
    `insert into rate_limit (key, window_start, hits) values (?, now(), 1)
     on conflict (key) do update set
       hits = case when rate_limit.window_start < now() - make_interval(secs => ?) then 1 else rate_limit.hits + 1 end,
       window_start = case when rate_limit.window_start < now() - make_interval(secs => ?) then now() else rate_limit.window_start end
     returning hits, extract(epoch from (window_start + make_interval(secs => ?) - now())) as retry_after`,
    [key, rule.windowSeconds, rule.windowSeconds, rule.windowSeconds],
  )) as { hits: number; retry_after: string }[];
  const row = rows[0];
  if (row && row.hits > rule.limit) {
    const retryAfter = Math.max(1, Math.ceil(Number(row.retry_after)));
    throw new AppError('RATE_LIMITED', message, 429, { retryAfterSeconds: retryAfter });
  }
}

export async function resetRateLimit(em: EntityManager, key: string): Promise<void> {
  await em.getConnection().execute('delete from rate_limit where key = ?', [key]);
}
