import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';
import { DEFAULT_ENGINE, modelPeaks, syntheticRunFile } from '@server/db/synthetic-runs';
import { Run } from '@server/modules/runs/run.entity';

/** Build stages, parts and costs, reference runs and the derived gains. */
let t: TestApp;
let a: TestShop;
let b: TestShop;
type Agent = ReturnType<typeof supertest.agent>;
let tuner: Agent;
let desk: Agent;
let owner: Agent;

async function uploadRun(agent: Agent, bikeId: string, seed: number, gain = 1) {
  const bytes = Buffer.from(syntheticRunFile({ seed, gain }).bytes);
  const res = await agent.post('/api/runs').field('bikeId', bikeId).attach('files', bytes, { filename: `seed-${seed}.csv`, contentType: 'text/csv' });
  expect(res.body.results[0].ok).toBe(true);
  return res.body.results[0].run as { id: string; peakPowerHp: number };
}

beforeAll(async () => {
  t = await createTestApp();
  a = await t.createShop('Stages Alpha');
  b = await t.createShop('Stages Beta');
  tuner = await t.signIn(a.users.tuner);
  desk = await t.signIn(a.users.desk);
  owner = await t.signIn(a.users.owner);
});
afterAll(() => t.close());

describe('stages and parts', () => {
  it('stores money entered in dollars as whole cents and totals the stage', async () => {
    const res = await tuner.post('/api/stages').send({
      bikeId: a.bike.id,
      name: 'Stage 1',
      date: '2026-03-14',
      parts: [
        { category: 'exhaust', description: '2-into-1 exhaust', partCost: 1049.99, labourCost: 180 },
        { category: 'fuel-tune', description: 'Fuel map on the dyno', partCost: 0, labourCost: 349.5 },
        { category: 'cylinder-heads', description: 'Bowl blend', partCost: '1.005', labourCost: null, headWorkLevel: 'mild-port' },
        { category: 'intake', description: 'Air cleaner', partCost: 259.95, headWorkLevel: 'cnc' },
      ],
    });
    expect(res.status).toBe(201);
    const cents = res.body.parts.map((p: { partCostCents: number; labourCostCents: number }) => [p.partCostCents, p.labourCostCents]);
    // $1.005 → 101 cents: half a cent rounds up, although 1.005 × 100 is 100.49999… in binary
    // floating point (IEEE 754 double; a naive Math.round would give 100).
    expect(1.005 * 100).toBeLessThan(100.5);
    expect(cents).toEqual([[104999, 18000], [0, 34950], [101, 0], [25995, 0]]);
    expect(res.body.totalCostCents).toBe(104999 + 18000 + 34950 + 101 + 25995);
    expect(res.body.parts[2].headWorkLevel).toBe('mild-port');
    expect(res.body.parts[3].headWorkLevel).toBeNull(); // head-work level only for cylinder heads
    expect(res.body.position).toBe(0);
    expect(res.body.date).toBe('2026-03-14');

    const stageId = res.body.id;
    const added = await tuner.post(`/api/stages/${stageId}/parts`).send({ category: 'ignition', description: 'Plug leads', partCost: 89.9 });
    expect(added.status).toBe(201);
    expect(added.body.totalCostCents).toBe(res.body.totalCostCents + 8990);
    const partId = added.body.parts.find((p: { description: string }) => p.description === 'Plug leads').id;
    const edited = await tuner.put(`/api/stages/${stageId}/parts/${partId}`).send({ category: 'ignition', description: 'Plug leads, silicone', partCost: 99.9, labourCost: 20 });
    expect(edited.body.totalCostCents).toBe(res.body.totalCostCents + 9990 + 2000);
    const removed = await tuner.delete(`/api/stages/${stageId}/parts/${partId}`);
    expect(removed.status).toBe(200);
    expect(removed.body.totalCostCents).toBe(res.body.totalCostCents);

    const replaced = await tuner.put(`/api/stages/${stageId}`).send({ name: 'Stage 1 (exhaust + tune)', parts: [{ category: 'exhaust', description: 'Exhaust', partCost: 1000 }] });
    expect(replaced.status).toBe(200);
    expect(replaced.body.name).toBe('Stage 1 (exhaust + tune)');
    expect(replaced.body.parts).toHaveLength(1);
    expect(replaced.body.totalCostCents).toBe(100000);
    expect(replaced.body.date).toBe('2026-03-14');

    expect((await tuner.post('/api/stages').send({ bikeId: a.bike.id, name: 'x', parts: [{ category: 'exhaust', description: 'y', partCost: -1 }] })).status).toBe(400);
    expect((await desk.post('/api/stages').send({ bikeId: a.bike.id, name: 'Desk stage' })).status).toBe(403);
    await tuner.delete(`/api/stages/${stageId}`);
  });

  it('derives gains from reference runs against the baseline and follows order changes', async () => {
    const baseline = await tuner.post('/api/stages').send({ bikeId: a.bike.id, name: 'Baseline' });
    const stage1 = await tuner.post('/api/stages').send({ bikeId: a.bike.id, name: 'Exhaust + tune', parts: [{ category: 'exhaust', description: 'Exhaust', partCost: 900, labourCost: 150 }] });
    expect(stage1.body.position).toBe(baseline.body.position + 1);
    const baseRun = await uploadRun(tuner, a.bike.id, 10);
    // The invented engine with 8 % more torque everywhere (synthetic-runs.ts `gain`).
    const s1Run = await uploadRun(tuner, a.bike.id, 11, 1.08);

    const setBase = await tuner.post(`/api/stages/${baseline.body.id}/reference-run`).send({ runId: baseRun.id });
    expect(setBase.status).toBe(200);
    expect(setBase.body.referenceRunId).toBe(baseRun.id);
    expect(setBase.body.gainPeakPowerHp).toBeNull();
    const set1 = await tuner.post(`/api/stages/${stage1.body.id}/reference-run`).send({ runId: s1Run.id });
    // Known answer of the model: 8 % more torque at every rpm is 8 % more peak power
    // (hp = lb·ft × rpm / 5252.113); tolerance 0.6 hp for noise and smoothing (ours).
    const truth = modelPeaks(DEFAULT_ENGINE, 2000, 5800).peakPower.hp;
    expect(set1.body.gainPeakPowerHp).toBeCloseTo(0.08 * truth, 0);
    expect(Math.abs(set1.body.gainPeakPowerHp - 0.08 * truth)).toBeLessThan(0.6);
    expect(set1.body.gainAreaPct).toBeGreaterThan(6);
    expect(set1.body.gainAreaPct).toBeLessThan(10);
    // The reference run is tagged with its stage, and flagged in the run list.
    const run = await desk.get(`/api/runs/${s1Run.id}`);
    expect(run.body).toMatchObject({ stageId: stage1.body.id, isReference: true });

    const list = await desk.get('/api/stages').query({ bikeId: a.bike.id });
    expect(list.body.items.map((s: { name: string }) => s.name)).toEqual(['Baseline', 'Exhaust + tune']);
    expect(list.body.items[1].runCount).toBe(1);
    expect(list.body.items[1].totalCostCents).toBe(105000);

    // Reordered, the other stage becomes the baseline and the gain changes sign.
    const reordered = await tuner.post('/api/stages/reorder').send({ bikeId: a.bike.id, stageIds: [stage1.body.id, baseline.body.id] });
    expect(reordered.status).toBe(200);
    expect(reordered.body.items.map((s: { name: string }) => s.name)).toEqual(['Exhaust + tune', 'Baseline']);
    expect(reordered.body.items[0].gainPeakPowerHp).toBeNull();
    expect(reordered.body.items[1].gainPeakPowerHp).toBeLessThan(-0.05 * truth);
    expect((await tuner.post('/api/stages/reorder').send({ bikeId: a.bike.id, stageIds: [stage1.body.id] })).status).toBe(400);
    await tuner.post('/api/stages/reorder').send({ bikeId: a.bike.id, stageIds: [baseline.body.id, stage1.body.id] });

    // Clearing the reference run clears the gain.
    const cleared = await tuner.post(`/api/stages/${stage1.body.id}/reference-run`).send({ runId: null });
    expect(cleared.body.referenceRunId).toBeNull();
    expect(cleared.body.gainPeakPowerHp).toBeNull();
    await tuner.post(`/api/stages/${stage1.body.id}/reference-run`).send({ runId: s1Run.id });

    // Deleting the reference run (owner) takes it off the stage.
    await owner.delete(`/api/runs/${s1Run.id}`);
    const after = await desk.get(`/api/stages/${stage1.body.id}`);
    expect(after.body.referenceRunId).toBeNull();
    expect(after.body.gainPeakPowerHp).toBeNull();
    await owner.post(`/api/runs/${s1Run.id}/restore`);

    // A stage's reference must be a usable run of the same bike.
    const other = await uploadRun(tuner, a.otherBike.id, 12);
    expect((await tuner.post(`/api/stages/${stage1.body.id}/reference-run`).send({ runId: other.id })).status).toBe(404);
    const empty = await tuner.post('/api/runs').field('bikeId', a.bike.id).attach('files', Buffer.alloc(0), { filename: 'empty.csv' });
    expect((await tuner.post(`/api/stages/${stage1.body.id}/reference-run`).send({ runId: empty.body.results[0].runId })).status).toBe(409);

    // Deleting a stage keeps its runs, without a stage.
    expect((await tuner.delete(`/api/stages/${stage1.body.id}`)).status).toBe(204);
    const kept = await t.deps.orm.em.fork().findOneOrFail(Run, { id: s1Run.id });
    expect(kept.stage).toBeNull();
    expect(kept.deletedAt).toBeNull();

    const audit = await owner.get('/api/audit').query({ limit: 500 });
    const actions = new Set(audit.body.items.map((e: { action: string }) => e.action));
    for (const a of ['stage.create', 'stage.reference-run', 'stage.reorder', 'stage.delete']) expect(actions.has(a), a).toBe(true);
  });

  it('shows a customer their own bike’s build only, read-only, and keeps shops apart', async () => {
    const customer = await t.signIn(a.users.customer);
    const own = await customer.get('/api/stages').query({ bikeId: a.bike.id });
    expect(own.status).toBe(200);
    expect(own.body.items.map((s: { name: string }) => s.name)).toEqual(['Baseline']);
    const otherStage = await tuner.post('/api/stages').send({ bikeId: a.otherBike.id, name: 'Other baseline' });
    expect((await customer.get('/api/stages').query({ bikeId: a.otherBike.id })).status).toBe(404);
    expect((await customer.get(`/api/stages/${otherStage.body.id}`)).status).toBe(404);
    expect((await customer.post(`/api/stages/${own.body.items[0].id}/parts`).send({ category: 'other', description: 'x' })).status).toBe(403);

    const bTuner = await t.signIn(b.users.tuner);
    const id = own.body.items[0].id;
    expect((await bTuner.get('/api/stages').query({ bikeId: a.bike.id })).status).toBe(404);
    expect((await bTuner.get(`/api/stages/${id}`)).status).toBe(404);
    expect((await bTuner.put(`/api/stages/${id}`).send({ name: 'x' })).status).toBe(404);
    expect((await bTuner.delete(`/api/stages/${id}`)).status).toBe(404);
    expect((await bTuner.post(`/api/stages/${id}/parts`).send({ category: 'other', description: 'x' })).status).toBe(404);
    expect((await bTuner.post(`/api/stages/${id}/reference-run`).send({ runId: null })).status).toBe(404);
    expect((await bTuner.post('/api/stages/reorder').send({ bikeId: a.bike.id, stageIds: [id] })).status).toBe(404);
    expect((await bTuner.post('/api/stages').send({ bikeId: a.bike.id, name: 'x' })).status).toBe(404);
  });
});
