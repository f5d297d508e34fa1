/**
 * POST /api/runs/stage: several runs of one bike take a stage in one transaction (bulk tagging on
 * the upload result and the session page), with an audit line per run; a run leaving its stage
 * stops representing it; runs of two bikes, or of another shop, are refused.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';
import { runFile, uploadRuns } from '../support/run-fixtures';

let t: TestApp;
let a: TestShop;
let b: TestShop;

beforeAll(async () => {
  t = await createTestApp();
  a = await t.createShop('Bulk Alpha');
  b = await t.createShop('Bulk Beta');
}, 60_000);
afterAll(() => t?.close());

async function fourRuns(agent: Awaited<ReturnType<TestApp['signIn']>>, bikeId: string, seed: number) {
  const res = await uploadRuns(
    agent,
    bikeId,
    [0, 1, 2, 3].map((i) => ({ name: `bulk-${seed}-${i}.csv`, bytes: runFile(seed + i) })),
  );
  expect(res.status).toBe(201);
  return (res.body.results as { run: { id: string } }[]).map((r) => r.run.id);
}

describe('bulk stage tagging', () => {
  it('tags many runs at once, clears a reference that leaves its stage, and writes an audit line per run', async () => {
    const tuner = await t.signIn(a.users.tuner);
    const ids = await fourRuns(tuner, a.bike.id, 7100);
    const base = (await tuner.post('/api/stages').send({ bikeId: a.bike.id, name: 'Baseline' })).body.id as string;
    const one = (await tuner.post('/api/stages').send({ bikeId: a.bike.id, name: 'Stage 1' })).body.id as string;

    const res = await tuner.post('/api/runs/stage').send({ runIds: ids, stageId: base });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ updated: 4 });
    const list = (await tuner.get('/api/runs').query({ bikeId: a.bike.id, pageSize: 50 })).body.items as { id: string; stageId: string | null }[];
    expect(list.filter((r) => ids.includes(r.id)).every((r) => r.stageId === base)).toBe(true);

    // Runs already on the stage are left as they are.
    expect((await tuner.post('/api/runs/stage').send({ runIds: ids, stageId: base })).body).toEqual({ updated: 0 });

    expect((await tuner.post(`/api/stages/${base}/reference-run`).send({ runId: ids[0] })).status).toBe(200);
    expect((await tuner.post('/api/runs/stage').send({ runIds: ids.slice(0, 2), stageId: one })).body).toEqual({ updated: 2 });
    const stages = (await tuner.get('/api/stages').query({ bikeId: a.bike.id })).body.items as { id: string; referenceRunId: string | null; runCount: number }[];
    expect(stages.find((s) => s.id === base)).toMatchObject({ referenceRunId: null, runCount: 2 });
    expect(stages.find((s) => s.id === one)).toMatchObject({ runCount: 2 });

    const audit = (await t.deps.orm.em.fork().getConnection().execute(`select count(*)::int as n from audit_entry where action = 'run.update' and entity_id = ?`, [ids[0]])) as { n: number }[];
    expect(audit[0].n).toBe(2);

    // Clearing the stage.
    expect((await tuner.post('/api/runs/stage').send({ runIds: ids.slice(0, 1), stageId: null })).body).toEqual({ updated: 1 });
  }, 60_000);

  it('lets two people tag runs of one stage at the same moment (the build index refresh waits its turn)', async () => {
    const tuner = await t.signIn(a.users.tuner);
    const owner = await t.signIn(a.users.owner);
    const ids = [...(await fourRuns(tuner, a.bike.id, 7300)), ...(await fourRuns(tuner, a.bike.id, 7400))];
    const stage = (await tuner.post('/api/stages').send({ bikeId: a.bike.id, name: 'Stage 2' })).body.id as string;
    // Each PATCH refreshes the bike's build_index rows; before the per-bike lock, parallel ones
    // collided on its primary key and answered 500.
    const answers = await Promise.all(ids.map((id, i) => (i % 2 ? owner : tuner).patch(`/api/runs/${id}`).send({ stageId: stage })));
    expect(answers.map((r) => r.status)).toEqual(ids.map(() => 200));
    const stages = (await tuner.get('/api/stages').query({ bikeId: a.bike.id })).body.items as { id: string; runCount: number }[];
    expect(stages.find((s) => s.id === stage)).toMatchObject({ runCount: 8 });
  }, 60_000);

  it('refuses runs of two bikes, a stage of another bike, another shop and the wrong roles', async () => {
    const tuner = await t.signIn(a.users.tuner);
    const mine = await fourRuns(tuner, a.bike.id, 7200);
    const other = await fourRuns(tuner, a.otherBike.id, 7300);
    const otherStage = (await tuner.post('/api/stages').send({ bikeId: a.otherBike.id, name: 'Other' })).body.id as string;
    const twoBikes = await tuner.post('/api/runs/stage').send({ runIds: [mine[0], other[0]], stageId: null });
    expect(twoBikes.status).toBe(400);
    expect(twoBikes.body.error.code).toBe('VALIDATION_FAILED');
    expect((await tuner.post('/api/runs/stage').send({ runIds: mine, stageId: otherStage })).status).toBe(404);
    const outsider = await t.signIn(b.users.tuner);
    expect((await outsider.post('/api/runs/stage').send({ runIds: mine, stageId: null })).status).toBe(404);
    expect((await (await t.signIn(a.users.desk)).post('/api/runs/stage').send({ runIds: mine, stageId: null })).status).toBe(403);
    expect((await tuner.post('/api/runs/stage').send({ runIds: [], stageId: null })).status).toBe(400);
  }, 60_000);
});
