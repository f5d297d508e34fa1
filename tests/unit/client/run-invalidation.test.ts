import { afterEach, describe, expect, it, vi } from 'vitest';
import { MutationObserver, QueryClient, type QueryKey } from '@tanstack/react-query';
import { bikeKeys, buildKeys, comparisonKeys, customerKeys, reportKeys, runKeys, sessionKeys, stageKeys } from '@/lib/query-keys';
import { invalidateAfterUpload } from '@/features/runs/api/runs/upload-runs';
import { updateRunMutation } from '@/features/runs/api/runs/update-run';
import { deleteRunMutation } from '@/features/runs/api/runs/delete-run';
import { restoreRunMutation } from '@/features/runs/api/runs/restore-run';
import { setReferenceRunMutation } from '@/features/runs/api/stages/set-reference-run';
import { applyMappingMutation } from '@/features/runs/api/runs/apply-mapping';

/** A fresh client per test, retries off, with nothing fetched: the cache is filled by hand. */
function freshClient() {
  return new QueryClient({ defaultOptions: { queries: { retry: false, staleTime: Infinity }, mutations: { retry: false } } });
}

/** The views a run change must refresh, as a screen would have cached them. */
const RUN_VIEWS: Record<string, QueryKey> = {
  'bike timeline (gains by stage)': comparisonKeys.timeline('bike-1'),
  'comparison candidates': comparisonKeys.candidates('bike-1'),
  'run list': runKeys.list({ bikeId: 'bike-1', page: 1, pageSize: 25 }),
  'run page': runKeys.detail('run-1'),
  'session page': sessionKeys.detail('session-1'),
  'session runs': runKeys.list({ sessionId: 'session-1', pageSize: 200, sort: 'createdAt' }),
  'stage list': stageKeys.list('bike-1'),
  'build finder': buildKeys.similar('bike-1'),
  'Today page bikes': bikeKeys.list({ sort: '-createdAt', page: 1, pageSize: 5 }),
};
/** Views no run change touches: they must stay fresh. */
const UNRELATED: Record<string, QueryKey> = {
  'customer list': customerKeys.list({ page: 1, pageSize: 25 }),
  'a saved comparison': comparisonKeys.detail('cmp-1'),
  'a report': reportKeys.detail('rep-1'),
};

function seed(qc: QueryClient) {
  for (const key of [...Object.values(RUN_VIEWS), ...Object.values(UNRELATED)]) qc.setQueryData(key, { seeded: true });
}

function staleViews(qc: QueryClient, views: Record<string, QueryKey>): string[] {
  return Object.entries(views)
    .filter(([, key]) => qc.getQueryState(key)?.isInvalidated)
    .map(([name]) => name);
}

function answerFetch(body: unknown) {
  const fetch = vi.fn(async () => new Response(JSON.stringify(body), { status: 200, headers: { 'Content-Type': 'application/json' } }));
  vi.stubGlobal('fetch', fetch);
  return fetch;
}

afterEach(() => vi.unstubAllGlobals());

describe('run changes refresh every view that shows runs', () => {
  it('an upload refreshes gains by stage, comparison candidates, run lists, the session page and Today', async () => {
    const qc = freshClient();
    seed(qc);
    await invalidateAfterUpload(qc);
    expect(staleViews(qc, RUN_VIEWS)).toEqual(Object.keys(RUN_VIEWS));
    expect(staleViews(qc, UNRELATED)).toEqual([]);
  });

  it('re-tagging a run (stage change) refreshes the same views, after the server answered', async () => {
    const qc = freshClient();
    seed(qc);
    const fetch = answerFetch({ id: 'run-1' });
    await new MutationObserver(qc, updateRunMutation(qc)).mutate({ id: 'run-1', stageId: 'stage-2' });
    expect(fetch).toHaveBeenCalledWith('/api/runs/run-1', expect.objectContaining({ method: 'PATCH' }));
    expect(staleViews(qc, RUN_VIEWS)).toEqual(Object.keys(RUN_VIEWS));
    expect(staleViews(qc, UNRELATED)).toEqual([]);
  });

  it('a failed re-tag leaves the cache alone', async () => {
    const qc = freshClient();
    seed(qc);
    vi.stubGlobal('fetch', vi.fn(async () => new Response(JSON.stringify({ error: { code: 'NOT_FOUND', message: 'Run not found' } }), { status: 404 })));
    await expect(new MutationObserver(qc, updateRunMutation(qc)).mutate({ id: 'run-1', label: 'x' })).rejects.toMatchObject({ code: 'NOT_FOUND', status: 404 });
    expect(staleViews(qc, RUN_VIEWS)).toEqual([]);
  });

  it('deleting, restoring, choosing the reference run and mapping columns refresh them too', async () => {
    answerFetch({ id: 'run-1' });
    const cases: [string, (qc: QueryClient) => Promise<unknown>][] = [
      ['delete', (qc) => new MutationObserver(qc, deleteRunMutation(qc)).mutate('run-1')],
      ['restore', (qc) => new MutationObserver(qc, restoreRunMutation(qc)).mutate('run-1')],
      ['reference run', (qc) => new MutationObserver(qc, setReferenceRunMutation(qc)).mutate({ stageId: 'stage-1', runId: 'run-1' })],
      ['mapping', (qc) => new MutationObserver(qc, applyMappingMutation(qc)).mutate({ runId: 'run-1', rpm: 'RPM', torque: 'TQ', torqueUnit: 'lbft' } as never)],
    ];
    for (const [name, run] of cases) {
      const qc = freshClient();
      seed(qc);
      await run(qc);
      expect({ name, stale: staleViews(qc, RUN_VIEWS) }).toEqual({ name, stale: Object.keys(RUN_VIEWS) });
    }
  });
});
