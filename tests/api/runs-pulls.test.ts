import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';
import { sha256Hex as sha, uploadRuns as upload, type Agent } from '../support/run-fixtures';
import { modelPeaks, renderRunFile, syntheticRun, threePullLog, withGlitches, type SyntheticGlitch } from '@server/db/synthetic-runs';
import type { RunSummaryDto, UploadResult } from '@shared/schemas/run';
import { Run } from '@server/modules/runs/run.entity';
import { OrphanObject } from '@server/lib/storage/orphan-object.entity';
import { reconcileOrphanObjects } from '@server/modules/runs/orphan-reconcile';
import { rawKeyFor } from '@server/modules/runs/raw-store';
import { reprocessAll } from '@server/modules/runs/run-cli';

/**
 * Several pulls in one log, through the upload API, the database, re-processing and the mapping
 * route. Expected peaks come from the invented engine's closed-form curve (server/db/synthetic-runs.ts),
 * never from the engine under test: hp = lbf·ft × rpm / 5252.113, since 1 hp = 550 ft·lbf/s =
 * 33 000 ft·lbf/min and one revolution is 2π rad (NIST SP 811, 2008, Appendix B).
 */
let t: TestApp;
let a: TestShop;
let tuner: Agent;
let owner: Agent;

const within1pct = (value: number, truth: number) => Math.abs(value / truth - 1) < 0.01;
const codes = (r: RunSummaryDto) => r.warnings.map((w) => w.code);

// Three pulls: two full sweeps and one aborted early (invented figures).
const LOG = threePullLog(3);
const LOG_BYTES = Buffer.from(renderRunFile(LOG).bytes);

/** Peaks of a run divided back to uncorrected (the stored curve is uncorrected; no conditions here). */
const uncorrected = (r: RunSummaryDto) => ({ hp: r.peakPowerHp! / (r.correctionFactor ?? 1), lbft: r.peakTorqueLbft! / (r.correctionFactor ?? 1) });

function expectModelPeaks(r: RunSummaryDto) {
  const truth = modelPeaks(LOG.engine, r.rpmMin!, r.rpmMax!);
  const got = uncorrected(r);
  expect(within1pct(got.hp, truth.peakPower.hp), `${got.hp} hp against the model's ${truth.peakPower.hp}`).toBe(true);
  expect(within1pct(got.lbft, truth.peakTorque.lbft), `${got.lbft} lb·ft against the model's ${truth.peakTorque.lbft}`).toBe(true);
}

beforeAll(async () => {
  t = await createTestApp();
  a = await t.createShop('Pulls');
  tuner = await t.signIn(a.users.tuner);
  owner = await t.signIn(a.users.owner);
});
afterAll(() => t.close());

describe('a log holding three pulls', () => {
  let result: UploadResult;

  it('becomes three runs on one stored raw file, with their pull indexes and their own peaks', async () => {
    const res = await upload(tuner, a.bike.id, [{ name: 'three-pulls.csv', bytes: LOG_BYTES }]);
    expect(res.status, JSON.stringify(res.body).slice(0, 400)).toBe(201);
    expect(res.body.results).toHaveLength(1);
    result = res.body.results[0];
    expect(result.ok).toBe(true);
    expect(result.pullCount).toBe(3);
    const runs = result.runs!;
    expect(runs.map((r) => [r.pullIndex, r.pullCount, r.status])).toEqual([
      [0, 3, 'ready'],
      [1, 3, 'ready'],
      [2, 3, 'ready'],
    ]);
    expect(new Set(runs.map((r) => r.id)).size).toBe(3);
    expect(runs.map((r) => r.sequence)).toEqual([1, 2, 3]);
    // The file answers with its first readable run.
    if (result.ok) expect(result.run.id).toBe(runs[0].id);
    // Each run is its own pull: its rpm range and peaks are that pull's, within 1 % of the model.
    runs.forEach((r, i) => {
      expect(r.rpmMin!).toBeLessThanOrEqual(LOG.pulls[i].startRpm + 100);
      expect(r.rpmMax!).toBeGreaterThanOrEqual(LOG.pulls[i].endRpm - 100);
      expect(r.rpmMax!).toBeLessThanOrEqual(LOG.pulls[i].endRpm + 50);
      expectModelPeaks(r);
      expect(codes(r)).toContain('PULLS_FOUND');
    });
    // The aborted pull is listed but marked.
    expect(codes(runs[2])).toContain('PULL_PARTIAL');
    expect(codes(runs[0])).not.toContain('PULL_PARTIAL');

    const rows = await t.deps.orm.em.fork().find(Run, { id: { $in: runs.map((r) => r.id) } }, { orderBy: { pullIndex: 'asc' } });
    const key = rawKeyFor(a.shop.id, a.bike.id, sha(LOG_BYTES));
    expect(rows.map((r) => r.rawKey)).toEqual([key, key, key]);
    expect(new Set(rows.map((r) => r.rawSha256))).toEqual(new Set([sha(LOG_BYTES)]));
    expect(rows.map((r) => r.pullIndex)).toEqual([0, 1, 2]);
    // Pulls lie one after another in the log: time and data-row ranges do not overlap.
    for (let i = 1; i < rows.length; i++) {
      expect(rows[i].pullStartS!).toBeGreaterThan(rows[i - 1].pullEndS!);
      expect(rows[i].pullFirstRow!).toBeGreaterThan(rows[i - 1].pullLastRow!);
    }
    expect(await t.deps.storage.exists(key)).toBe(true);

    const detail = await tuner.get(`/api/runs/${runs[1].id}`);
    expect(detail.status).toBe(200);
    expect(detail.body.pullIndex).toBe(1);
    expect(detail.body.pullTimeS).toEqual([rows[1].pullStartS, rows[1].pullEndS]);
    expect(detail.body.pullRows).toEqual([rows[1].pullFirstRow, rows[1].pullLastRow]);
  });

  it('uploaded again is a duplicate for every one of its runs; nothing new is saved', async () => {
    const before = await t.deps.orm.em.fork().count(Run, { bike: a.bike.id });
    const res = await upload(tuner, a.bike.id, [{ name: 'three-pulls-again.csv', bytes: LOG_BYTES }]);
    expect(res.status).toBe(201);
    const again: UploadResult = res.body.results[0];
    expect(again.ok && again.duplicate).toBe(true);
    expect(again.pullCount).toBe(3);
    expect(again.runs!.map((r) => r.id)).toEqual(result.runs!.map((r) => r.id));
    expect(await t.deps.orm.em.fork().count(Run, { bike: a.bike.id })).toBe(before);
  });

  it('re-processing re-derives each run from its own pull and reports no change', async () => {
    for (const r of result.runs!) {
      const res = await tuner.post(`/api/runs/${r.id}/reprocess`);
      expect(res.status).toBe(200);
      expect(res.body.changes).toEqual([]);
      expect(res.body.pullIndex).toBe(r.pullIndex);
      expect(res.body.rpmMax).toBe(r.rpmMax);
      expect(res.body.peakPowerHp).toBeCloseTo(r.peakPowerHp!, 6);
    }
    // The command line says which pull each line is.
    const lines = await reprocessAll(t.deps);
    const mine = lines.filter((l) => result.runs!.some((r) => r.id === l.runId));
    expect(mine.map((l) => [l.pull, l.changes.length, l.error])).toEqual(
      expect.arrayContaining([
        ['pull 1 of 3', 0, undefined],
        ['pull 2 of 3', 0, undefined],
        ['pull 3 of 3', 0, undefined],
      ]),
    );
  });

  it('a comparison with the aborted pull says so in its fairness warnings', async () => {
    const [full, , partial] = result.runs!;
    const res = await tuner.post('/api/comparisons/preview').send({ runIds: [full.id, partial.id], baselineRunId: full.id });
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(200);
    const partialWarning = (res.body.warnings as { code: string; runIds?: string[] }[]).find((w) => w.code === 'PARTIAL_PULL');
    expect(partialWarning?.runIds).toEqual([partial.id]);
  });

  it('keeps the shared raw object while any run points at it (orphan reconciliation, delete and restore)', async () => {
    const key = rawKeyFor(a.shop.id, a.bike.id, sha(LOG_BYTES));
    const [first, second] = result.runs!;
    expect((await owner.delete(`/api/runs/${first.id}`)).status).toBe(200);
    // A stale orphan note for the key (e.g. left by a failed upload of the same file) must not remove it.
    const em = t.deps.orm.em.fork();
    em.create(OrphanObject, { key, reason: 'test: stale note' } as OrphanObject);
    await em.flush();
    const out = await reconcileOrphanObjects(t.deps);
    expect(out.kept).toBeGreaterThanOrEqual(1);
    expect(await t.deps.storage.exists(key)).toBe(true);
    // The other runs still read their file.
    expect((await tuner.post(`/api/runs/${second.id}/reprocess`)).body.changes).toEqual([]);
    expect((await owner.post(`/api/runs/${first.id}/restore`)).status).toBe(200);
    expect((await tuner.post(`/api/runs/${first.id}/reprocess`)).body.changes).toEqual([]);
  });
});

describe('a log with road speed but no engine speed', () => {
  const columns = ['time', 'speed', 'torque', 'power'] as const;

  it('waits for a mapping; with an engine-speed ratio it reads against engine speed, keeps the ratio and uses it on re-processing', async () => {
    // The generator logs road speed as rpm / 46: 46 rpm per mph in that gear (invented).
    const run = syntheticRun({ seed: 11, rpmNoise: 2, torqueNoise: 0.05 });
    const bytes = Buffer.from(renderRunFile(run, { columns: [...columns] }).bytes);
    const res = await upload(tuner, a.otherBike.id, [{ name: 'road-speed.csv', bytes }]);
    const r: UploadResult = res.body.results[0];
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.error.code).toBe('NO_RPM_COLUMN');
    // The answer carries the reader's mapping help: the speed column it found.
    expect(r.error.details).toMatchObject({ speedColumn: 'Road Speed [mph]', needs: ['rpm'] });
    const waiting = await tuner.get(`/api/runs/${r.runId}`);
    expect(waiting.body.status).toBe('needs-mapping');

    const bad = await tuner.post(`/api/runs/${r.runId}/mapping`).send({ rpmPerSpeed: { ratio: -3, unit: 'mph' } });
    expect(bad.status).toBe(400);
    const neither = await tuner.post(`/api/runs/${r.runId}/mapping`).send({});
    expect(neither.status).toBe(400);

    const mapped = await tuner.post(`/api/runs/${r.runId}/mapping`).send({ rpmPerSpeed: { ratio: 46, unit: 'mph' } });
    expect(mapped.status, JSON.stringify(mapped.body).slice(0, 300)).toBe(200);
    expect(mapped.body.status).toBe('ready');
    expect(mapped.body.rpmPerSpeed).toEqual({ ratio: 46, unit: 'mph' });
    expect(mapped.body.warnings.map((w: { code: string }) => w.code)).toContain('RPM_FROM_SPEED');
    // Plotted against engine speed: the curve's rpm axis is the engine's, and the peaks are the model's.
    expect(mapped.body.curve.rpm[0]).toBeLessThanOrEqual(run.truth.startRpm + 100);
    expect(mapped.body.rpmMax).toBeGreaterThanOrEqual(run.truth.endRpm - 100);
    expect(within1pct(mapped.body.peakPowerHp / (mapped.body.correctionFactor ?? 1), run.truth.peakPower.hp)).toBe(true);
    expect(within1pct(mapped.body.peakTorqueLbft / (mapped.body.correctionFactor ?? 1), run.truth.peakTorque.lbft)).toBe(true);
    const row = await t.deps.orm.em.fork().findOneOrFail(Run, { id: r.runId! });
    expect(row.rpmPerSpeed).toEqual({ ratio: 46, unit: 'mph' });

    const again = await tuner.post(`/api/runs/${r.runId}/reprocess`);
    expect(again.body.changes).toEqual([]);
    expect(again.body.status).toBe('ready');
  });

  it('a three-pull road-speed log, once given its ratio, becomes a run per pull', async () => {
    const bytes = Buffer.from(renderRunFile(LOG, { columns: [...columns] }).bytes);
    const res = await upload(tuner, a.otherBike.id, [{ name: 'road-speed-log.csv', bytes }]);
    const r: UploadResult = res.body.results[0];
    expect(r.ok).toBe(false);
    const mapped = await tuner.post(`/api/runs/${r.ok ? '' : r.runId}/mapping`).send({ rpmPerSpeed: { ratio: 46, unit: 'mph' } });
    expect(mapped.status).toBe(200);
    expect([mapped.body.pullIndex, mapped.body.pullCount]).toEqual([0, 3]);
    const rows = await t.deps.orm.em.fork().find(Run, { bike: a.otherBike.id, rawSha256: sha(bytes) }, { orderBy: { pullIndex: 'asc' } });
    expect(rows.map((x) => [x.pullIndex, x.status])).toEqual([
      [0, 'ready'],
      [1, 'ready'],
      [2, 'ready'],
    ]);
    expect(rows.every((x) => x.rpmPerSpeed?.ratio === 46)).toBe(true);
    // Uploading it again now answers all three runs.
    const dup: UploadResult = (await upload(tuner, a.otherBike.id, [{ name: 'road-speed-log.csv', bytes }])).body.results[0];
    expect(dup.ok && dup.duplicate).toBe(true);
    expect(dup.runs!.map((x) => x.id)).toEqual(rows.map((x) => x.id));
  });
});

describe('no silent trust', () => {
  it('a run with more than 10 % glitches is marked for review in the list and detail, and a comparison says so', async () => {
    // A drop-out every sixth sample of the sweep (invented): about 17 % of its samples.
    const clean = syntheticRun({ seed: 31, rpmNoise: 2, torqueNoise: 0.05 });
    const glitches: SyntheticGlitch[] = [];
    for (let i = clean.truth.sweepStart + 3; i < clean.truth.sweepEnd; i += 6) glitches.push({ at: i, kind: 'dropout' });
    const spiky = Buffer.from(renderRunFile(withGlitches(clean, glitches)).bytes);
    const other = Buffer.from(renderRunFile(syntheticRun({ seed: 32, rpmNoise: 2, torqueNoise: 0.05 })).bytes);
    const res = await upload(tuner, a.bike.id, [{ name: 'spiky.csv', bytes: spiky }, { name: 'clean.csv', bytes: other }]);
    const [r1, r2] = res.body.results as UploadResult[];
    expect(r1.ok && r2.ok).toBe(true);
    if (!r1.ok || !r2.ok) return;
    expect(r1.run.review).toBe(true);
    expect(codes(r1.run)).toEqual(expect.arrayContaining(['GLITCHES_DROPPED', 'GLITCHES_REVIEW']));
    expect(r2.run.review).toBe(false);
    const list = await tuner.get('/api/runs').query({ bikeId: a.bike.id, pageSize: 100 });
    const listed = (list.body.items as RunSummaryDto[]).find((x) => x.id === r1.run.id)!;
    expect(listed.review).toBe(true);
    expect(listed.warnings.find((w) => w.code === 'GLITCHES_REVIEW')?.message).toMatch(/\w/);
    const cmp = await tuner.post('/api/comparisons/preview').send({ runIds: [r2.run.id, r1.run.id], baselineRunId: r2.run.id });
    expect(cmp.status).toBe(200);
    const review = (cmp.body.warnings as { code: string; runIds?: string[] }[]).filter((w) => w.code === 'RUN_NEEDS_REVIEW' || w.code === 'GLITCHES_DROPPED');
    // Named once, under review, not again for its dropped glitches.
    expect(review.map((w) => [w.code, w.runIds])).toEqual([['RUN_NEEDS_REVIEW', [r1.run.id]]]);
  });
});
