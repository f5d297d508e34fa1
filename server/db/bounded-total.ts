/**
 * A list's total that costs at most a bounded walk: rows are counted exactly up to `limit`; above
 * that the total is the planner's row estimate for the same FROM … WHERE (planning only, no
 * scan), never less than `atLeast` (what the pages have already shown). `exact` says which.
 */
import type { EntityManager } from '@mikro-orm/postgresql';

export const EXACT_TOTAL_LIMIT = 1000;

/** `fromWhere`: "from … where …" with `?` placeholders bound by `params`. */
export async function boundedTotal(
  em: EntityManager,
  fromWhere: string,
  params: unknown[],
  opts: { limit?: number; atLeast?: number } = {},
): Promise<{ total: number; exact: boolean }> {
  const limit = opts.limit ?? EXACT_TOTAL_LIMIT;
  const conn = em.getConnection();
  const [{ n }] = (await conn.execute(`select count(*)::int as n from (select 1 ${fromWhere} limit ${limit + 1}) x`, params)) as { n: number }[];
  if (n <= limit) return { total: n, exact: true };
  const [row] = (await conn.execute(`explain (format json) select 1 ${fromWhere}`, params)) as { 'QUERY PLAN': [{ Plan: { 'Plan Rows': number } }] }[];
  return { total: Math.max(Math.round(row['QUERY PLAN'][0].Plan['Plan Rows']), n, opts.atLeast ?? 0), exact: false };
}
