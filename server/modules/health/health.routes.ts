import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';

async function probe(check: () => Promise<unknown>, timeoutMs = 2000): Promise<{ ok: boolean; error?: string }> {
  try {
    await Promise.race([check(), new Promise((_, reject) => setTimeout(() => reject(new Error('timed out')), timeoutMs))]);
    return { ok: true };
  } catch (err) {
    return { ok: false, error: err instanceof Error ? err.message || err.name : String(err) };
  }
}

export function healthRoutes(deps: AppDeps) {
  const api = new ApiRouter('/api/health', deps);
  api.route({
    method: 'get',
    path: '/',
    access: 'public',
    summary: 'State of the database and object storage',
    handler: async ({ res }) => {
      const [database, storage] = await Promise.all([
        probe(() => deps.orm.em.fork().getConnection().execute('select 1')),
        probe(() => deps.storage.ping()),
      ]);
      const ok = database.ok && storage.ok;
      res.status(ok ? 200 : 503).json({ status: ok ? 'ok' : 'degraded', database, storage });
    },
  });
  return api;
}
