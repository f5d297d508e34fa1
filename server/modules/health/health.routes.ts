import { ApiRouter, reply } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';
import type { HealthDto } from '@shared/schemas/common';
import { logger } from '../../lib/logger';

/** Try one dependency. The answer says only up or down: hosts, ports and driver errors go to the log, not to anonymous callers. */
async function probe(name: string, check: () => Promise<unknown>, timeoutMs = 2000): Promise<{ ok: boolean }> {
  let timer: NodeJS.Timeout | undefined;
  try {
    await Promise.race([check(), new Promise((_, reject) => (timer = setTimeout(() => reject(new Error('timed out')), timeoutMs)))]);
    return { ok: true };
  } catch (err) {
    logger.warn({ part: name, reason: err instanceof Error ? err.message || err.name : String(err) }, 'health: a part is down');
    return { ok: false };
  } finally {
    clearTimeout(timer);
  }
}

export function healthRoutes(deps: AppDeps) {
  const api = new ApiRouter('/api/health', deps);
  api.route({
    method: 'get',
    path: '/',
    access: 'public',
    summary: 'State of the database and object storage',
    handler: async () => {
      const [database, storage] = await Promise.all([
        probe('database', () => deps.orm.em.fork().getConnection().execute('select 1')),
        probe('object storage', () => deps.storage.ping()),
      ]);
      const ok = database.ok && storage.ok;
      const body: HealthDto = { status: ok ? 'ok' : 'degraded', database, storage };
      return reply(body, { status: ok ? 200 : 503 });
    },
  });
  return api;
}
