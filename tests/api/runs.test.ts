import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';
import { download, runFile as file, sha256Hex as sha, uploadRuns as upload, type Agent } from '../support/run-fixtures';
import { modelPeaks, syntheticRunFile } from '@server/db/synthetic-runs';
import { SAFETY_CHECKS } from '@shared/schemas/run';
import { Run } from '@server/modules/runs/run.entity';
import { OrphanObject } from '@server/lib/storage/orphan-object.entity';
import { reconcileOrphanObjects } from '@server/modules/runs/orphan-reconcile';
import { rawKeyFor } from '@server/modules/runs/raw-store';
import { importFolder, reprocessAll } from '@server/modules/runs/run-cli';
import { Stage } from '@server/modules/stages/stage.entity';
import os from 'node:os';

/**
 * Run archive API against the real PostgreSQL and the S3 fake. Run files come from the invented
 * engine model of server/db/synthetic-runs.ts (known answers) and from sample-data/.
 */
let t: TestApp;
let a: TestShop;
let b: TestShop;
let tuner: Agent;
let owner: Agent;
let desk: Agent;
let customer: Agent;

const SAMPLE = path.join(process.cwd(), 'sample-data');

beforeAll(async () => {
  t = await createTestApp();
  a = await t.createShop('Runs Alpha');
  b = await t.createShop('Runs Beta');
  tuner = await t.signIn(a.users.tuner);
  owner = await t.signIn(a.users.owner);
  desk = await t.signIn(a.users.desk);
  customer = await t.signIn(a.users.customer);
});
afterAll(() => t.close());

describe('upload', () => {
  it('stores ten files from one request, byte for byte, with the model’s peaks', async () => {
    const files = Array.from({ length: 10 }, (_, i) => ({ name: `pull-${i + 1}.csv`, bytes: file(100 + i) }));
    const res = await upload(tuner, a.bike.id, files);
    expect(res.status).toBe(201);
    expect(res.body.results).toHaveLength(10);
    // The invented engine's true peaks over the sweep (synthetic-runs.ts; hp = lb·ft × rpm / 5252.113).
    const truth = modelPeaks({ peakTorqueLbft: 96, peakTorqueRpm: 3400, falloff: 0.035 }, 2000, 5800);
    for (const [i, r] of res.body.results.entries()) {
      expect(r.ok, JSON.stringify(r)).toBe(true);
      expect(r.file).toBe(files[i].name);
      expect(r.run.sequence).toBe(i + 1);
      expect(r.run.status).toBe('ready');
      // Light smoothing and noise: within 1.5 % of the model (tolerance is ours).
      expect(Math.abs(r.run.peakPowerHp - truth.peakPower.hp) / truth.peakPower.hp).toBeLessThan(0.015);
      expect(Math.abs(r.run.peakTorqueLbft - truth.peakTorque.lbft) / truth.peakTorque.lbft).toBeLessThan(0.015);
    }
    for (const [i, r] of res.body.results.entries()) {
      const raw = await download(tuner, `/api/runs/${r.run.id}/raw`);
      expect(raw.status).toBe(200);
      expect(raw.headers['content-disposition']).toContain(files[i].name);
      expect(sha(raw.body as Buffer)).toBe(sha(files[i].bytes));
      const stored = await t.deps.storage.getBuffer(rawKeyFor(a.shop.id, a.bike.id, sha(files[i].bytes)));
      expect(sha(stored)).toBe(sha(files[i].bytes));
    }
  });
});

describe('duplicates and bad files', () => {
  it('recognises the same file uploaded twice to one bike and writes nothing new', async () => {
    const bytes = file(200);
    const first = await upload(tuner, a.bike.id, [{ name: 'twice.csv', bytes }]);
    expect(first.body.results[0].ok).toBe(true);
    const before = await t.deps.orm.em.fork().count(Run, { bike: a.bike.id });
    const second = await upload(tuner, a.bike.id, [{ name: 'twice-again.csv', bytes }]);
    expect(second.status).toBe(201);
    const r = second.body.results[0];
    expect(r).toMatchObject({ ok: true, duplicate: true, file: 'twice-again.csv' });
    expect(r.run.id).toBe(first.body.results[0].run.id);
    expect(r.message).toMatch(/already in the archive/i);
    expect(await t.deps.orm.em.fork().count(Run, { bike: a.bike.id })).toBe(before);
    // The same bytes for another bike are a new run of that bike.
    const other = await upload(tuner, a.otherBike.id, [{ name: 'twice.csv', bytes }]);
    expect(other.body.results[0].duplicate).toBeUndefined();
    expect(other.body.results[0].run.bikeId).toBe(a.otherBike.id);
  });

  it('keeps every bad file, listed with its error and its raw bytes', async () => {
    const header = Buffer.from('Engine Speed [rpm],Torque [lb-ft],Power [hp]\n');
    const binary = Buffer.from(Uint8Array.from({ length: 2000 }, (_, i) => (i * 37) % 256));
    const noPowerOrTorque = file(201, {}, { columns: ['time', 'rpm', 'afr'] });
    // Torque of 60 × the model (~5 800 lb·ft) is far beyond any motorcycle.
    const absurd = file(202, { gain: 60 });
    const cases = [
      { name: 'empty.csv', bytes: Buffer.alloc(0), code: 'EMPTY_FILE', status: 'failed' },
      { name: 'binary.bin', bytes: binary, code: 'BINARY_FILE', status: 'failed' },
      { name: 'header-only.csv', bytes: header, code: 'HEADER_ONLY', status: 'failed' },
      { name: 'no-load.csv', bytes: noPowerOrTorque, code: 'NO_POWER_OR_TORQUE', status: 'needs-mapping' },
      { name: 'absurd.csv', bytes: absurd, code: 'ABSURD_VALUE', status: 'failed' },
    ];
    const res = await upload(tuner, a.bike.id, cases);
    expect(res.status).toBe(201);
    for (const [i, c] of cases.entries()) {
      const r = res.body.results[i];
      expect(r.ok, c.name).toBe(false);
      expect(r.error.code, c.name).toBe(c.code);
      expect(r.error.message.length).toBeGreaterThan(10);
      expect(r.runId, c.name).toBeTruthy();
      const detail = await desk.get(`/api/runs/${r.runId}`);
      expect(detail.body.status, c.name).toBe(c.status);
      expect(detail.body.error.code).toBe(c.code);
      expect(detail.body.curve).toBeNull();
      const raw = await download(desk, `/api/runs/${r.runId}/raw`);
      expect(sha(raw.body as Buffer), c.name).toBe(sha(c.bytes));
    }
    const failed = await desk.get('/api/runs').query({ bikeId: a.bike.id, status: 'failed', pageSize: 200 });
    expect(failed.body.items.map((x: { originalName: string }) => x.originalName)).toEqual(expect.arrayContaining(['empty.csv', 'binary.bin', 'header-only.csv', 'absurd.csv']));
  });

  it('maps a file with no recognisable rpm column by hand, saves the layout and reuses it', async () => {
    // "Drum" reads like roller speed, so the engine-speed column is not recognised.
    const drum = (seed: number) => Buffer.from(syntheticRunFile({ seed }, { columns: ['time', 'rpm', 'torque', 'power'] }).text.replace('Engine Speed [rpm]', 'Drum'));
    const res = await upload(tuner, a.bike.id, [{ name: 'drum-1.csv', bytes: drum(300) }]);
    const r = res.body.results[0];
    expect(r.ok).toBe(false);
    expect(r.error.code).toBe('NO_RPM_COLUMN');
    const detail = await tuner.get(`/api/runs/${r.runId}`);
    expect(detail.body.status).toBe('needs-mapping');
    expect(detail.body.mappingHelp.headers).toEqual(['Time [s]', 'Drum', 'Torque [lb-ft]', 'Power [hp]']);
    const preview = await tuner.get(`/api/runs/${r.runId}/preview`);
    expect(preview.status).toBe(200);
    expect(preview.body.previewRows.length).toBeGreaterThan(3);
    // The invented run idles at 2 000 rpm (± a few rpm of noise) before the sweep.
    expect(Math.abs(Number(preview.body.previewRows[0][1]) - 2000)).toBeLessThan(25);

    const bad = await tuner.post(`/api/runs/${r.runId}/mapping`).send({ mapping: { rpm: 'Nope', torque: { column: 'Torque [lb-ft]', unit: 'lbft' } } });
    expect(bad.status).toBe(422);
    expect(bad.body.error.code).toBe('MAPPING_INVALID');

    const mapping = { rpm: 'Drum', torque: { column: 'Torque [lb-ft]', unit: 'lbft' }, power: { column: 'Power [hp]', unit: 'hp' } };
    const mapped = await tuner.post(`/api/runs/${r.runId}/mapping`).send({ mapping, saveLayoutName: 'Bay 3 export' });
    expect(mapped.status).toBe(200);
    expect(mapped.body.status).toBe('ready');
    expect(mapped.body.error).toBeNull();
    expect(mapped.body.mapping).toMatchObject(mapping);
    expect(mapped.body.curve.rpm.length).toBeGreaterThan(20);
    expect(mapped.body.peakPowerHp).toBeGreaterThan(70);

    const layouts = await desk.get('/api/column-layouts');
    expect(layouts.body.items.map((l: { name: string }) => l.name)).toContain('Bay 3 export');

    const next = await upload(tuner, a.bike.id, [{ name: 'drum-2.csv', bytes: drum(301) }]);
    expect(next.body.results[0].ok).toBe(true);
    expect(next.body.results[0].run.status).toBe('ready');
    const again = await tuner.get(`/api/runs/${next.body.results[0].run.id}`);
    expect(again.body.mapping).toMatchObject(mapping);

    // Forget the layout: the next such file waits for a mapping again.
    const id = layouts.body.items.find((l: { name: string }) => l.name === 'Bay 3 export').id;
    expect((await desk.delete(`/api/column-layouts/${id}`)).status).toBe(403);
    expect((await tuner.delete(`/api/column-layouts/${id}`)).status).toBe(204);
    const third = await upload(tuner, a.bike.id, [{ name: 'drum-3.csv', bytes: drum(302) }]);
    expect(third.body.results[0].error.code).toBe('NO_RPM_COLUMN');
  });

  it('reads every sample-data file through the same pipeline', async () => {
    const names = fs.readdirSync(SAMPLE).sort();
    const res = await upload(tuner, a.otherBike.id, names.map((n) => ({ name: n, bytes: fs.readFileSync(path.join(SAMPLE, n)) })));
    expect(res.status).toBe(201);
    for (const r of res.body.results) expect(r.ok, JSON.stringify(r.error)).toBe(true);
  });
});

describe('sessions, conditions and correction', () => {
  it('refuses uploads into a session until its safety checklist is confirmed, then corrects with its conditions', async () => {
    const created = await tuner.post('/api/sessions').send({ bikeId: a.bike.id, ambientTempC: 25, baroKpa: 99, humidityPct: 0, correctionStandard: 'din-70020' });
    expect(created.status).toBe(201);
    const sessionId = created.body.id;
    const refused = await upload(tuner, a.bike.id, [{ name: 's1.csv', bytes: file(400) }], { sessionId });
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('SAFETY_CHECK_REQUIRED');
    expect(refused.body.error.message).toMatch(/safety checklist/i);
    expect(await t.deps.orm.em.fork().count(Run, { session: sessionId })).toBe(0);

    const partial = await tuner.post(`/api/sessions/${sessionId}/safety-check`).send({ checks: [SAFETY_CHECKS[0].id] });
    expect(partial.status).toBe(400);
    const ok = await tuner.post(`/api/sessions/${sessionId}/safety-check`).send({ checks: SAFETY_CHECKS.map((c) => c.id) });
    expect(ok.status).toBe(200);
    expect(ok.body.safetyConfirmedByName).toBe(a.users.tuner.name);
    expect(ok.body.safetyConfirmedAt).toBeTruthy();

    const res = await upload(tuner, a.bike.id, [{ name: 's1.csv', bytes: file(400) }, { name: 's2.csv', bytes: file(401) }], { sessionId });
    expect(res.status).toBe(201);
    const [r1, r2] = res.body.results;
    expect([r1.run.sequence, r2.run.sequence]).toEqual([1, 2]);
    expect(r1.run.sessionId).toBe(sessionId);
    expect(r1.run.correctionStandard).toBe('din-70020');
    // DIN 70020: cf = (101.3 / p) × ((T + 273) / 293)^0.5 (reference 20 °C, 101.3 kPa, total
    // pressure; formula from memory of the standard's usual statement). 273.15 used for kelvin.
    const expected = (101.3 / 99) * Math.sqrt((25 + 273.15) / (20 + 273.15));
    expect(r1.run.correctionFactor).toBeCloseTo(expected, 4);
    const detail = await tuner.get(`/api/runs/${r1.run.id}`);
    expect(detail.body.conditions).toMatchObject({ temperatureC: 25, baroKpa: 99 });
    // The stored curve is uncorrected; the summary peak is the corrected one.
    expect(Math.max(...detail.body.curve.powerHp) * detail.body.correctionFactor).toBeCloseTo(detail.body.peakPowerHp, 6);

    const session = await desk.get(`/api/sessions/${sessionId}`);
    expect(session.body.runs.map((r: { id: string }) => r.id)).toEqual([r1.run.id, r2.run.id]);
    expect(session.body.runCount).toBe(2);

    // New conditions, then re-process: the factor follows the session.
    expect((await tuner.patch(`/api/sessions/${sessionId}`).send({ baroKpa: 101.3, ambientTempC: 20 })).status).toBe(200);
    const re = await tuner.post(`/api/runs/${r1.run.id}/reprocess`);
    expect(re.status).toBe(200);
    expect(re.body.correctionFactor).toBeCloseTo(1, 6);
    expect(re.body.changes.map((c: { field: string }) => c.field)).toContain('correctionFactor');
  });

  it('accepts uploads without a session and numbers them per bike', async () => {
    const res = await upload(tuner, a.otherBike.id, [{ name: 'loose-1.csv', bytes: file(500) }]);
    expect(res.body.results[0].run.sessionId).toBeNull();
    expect(res.body.results[0].run.sequence).toBeGreaterThan(1);
  });
});

describe('failures of storage and database', () => {
  it('answers 503 and writes no run row when object storage is down', async () => {
    const down = await createTestApp({ env: { S3_ENDPOINT: 'http://127.0.0.1:1' } });
    try {
      const shop = await down.createShop('Storage Down');
      const agent = await down.signIn(shop.users.tuner);
      const res = await upload(agent, shop.bike.id, [{ name: 'a.csv', bytes: file(600) }, { name: 'b.csv', bytes: file(601) }]);
      expect(res.status).toBe(503);
      expect(res.body.error.code).toBe('STORAGE_UNAVAILABLE');
      expect(await down.deps.orm.em.fork().count(Run, {})).toBe(0);
    } finally {
      await down.close();
    }
  });

  it('removes the stored object when the database write fails after the upload', async () => {
    const conn = t.deps.orm.em.getConnection();
    await conn.execute(`create or replace function pb_test_refuse_run() returns trigger language plpgsql as $$ begin raise exception 'simulated database failure'; end $$`);
    await conn.execute(`create trigger pb_test_refuse_run before insert on run for each row when (new.original_name = 'db-fails.csv') execute function pb_test_refuse_run()`);
    const bytes = file(700);
    const res = await upload(tuner, a.bike.id, [{ name: 'db-fails.csv', bytes }, { name: 'db-fine.csv', bytes: file(701) }]);
    expect(res.status).toBe(201);
    expect(res.body.results[0]).toMatchObject({ ok: false, error: { code: 'SAVE_FAILED' } });
    expect(res.body.results[1].ok).toBe(true);
    const key = rawKeyFor(a.shop.id, a.bike.id, sha(bytes));
    const gone = !(await t.deps.storage.exists(key));
    const recorded = (await t.deps.orm.em.fork().count(OrphanObject, { key })) > 0;
    expect(gone || recorded).toBe(true);
    expect(gone).toBe(true); // storage is up, so the immediate removal works
    await conn.execute(`drop trigger pb_test_refuse_run on run`);
  });

  it('reconciles recorded orphans at start-up, keeping objects a run refers to', async () => {
    const em = t.deps.orm.em.fork();
    const orphanKey = `shops/${a.shop.id}/bikes/${a.bike.id}/${'0'.repeat(64)}`;
    await t.deps.storage.put(orphanKey, Buffer.from('left behind'));
    const kept = await em.findOneOrFail(Run, { bike: a.bike.id, deletedAt: null }, { orderBy: { createdAt: 'asc' } });
    em.create(OrphanObject, { key: orphanKey, reason: 'test' } as OrphanObject);
    em.create(OrphanObject, { key: kept.rawKey, reason: 'test: uploaded again since' } as OrphanObject);
    await em.flush();
    const r = await reconcileOrphanObjects(t.deps);
    expect(r).toMatchObject({ removed: 1, kept: 1, failed: 0 });
    expect(await t.deps.storage.exists(orphanKey)).toBe(false);
    expect(await t.deps.storage.exists(kept.rawKey)).toBe(true);
    expect(await t.deps.orm.em.fork().count(OrphanObject, {})).toBe(0);
  });

  it('answers 413 with a clear message for a too-big file and for too many files', async () => {
    const small = await createTestApp({ env: { UPLOAD_MAX_FILE_BYTES: '4096', UPLOAD_MAX_FILES: '3' } });
    try {
      const shop = await small.createShop('Small Limits');
      const agent = await small.signIn(shop.users.tuner);
      const big = await upload(agent, shop.bike.id, [{ name: 'big.csv', bytes: file(800) }]);
      expect(big.status).toBe(413);
      expect(big.body.error.message).toMatch(/larger than the limit \(4 KB per file\)/);
      const tiny = Buffer.from('Engine Speed [rpm],Torque [lb-ft]\n2000,50\n');
      const many = await upload(agent, shop.bike.id, Array.from({ length: 4 }, (_, i) => ({ name: `t${i}.csv`, bytes: Buffer.concat([tiny, Buffer.from(String(i))]) })));
      expect(many.status).toBe(413);
      expect(many.body.error.message).toMatch(/Too many files.*at most 3 files per upload/);
      expect(await small.deps.orm.em.fork().count(Run, {})).toBe(0);
    } finally {
      await small.close();
    }
  });
});

describe('list, edit, delete, roles and tenants', () => {
  it('filters, sorts and pages on the server', async () => {
    const all = await desk.get('/api/runs').query({ bikeId: a.bike.id, status: 'ready', sort: '-peakPowerHp', pageSize: 5 });
    expect(all.status).toBe(200);
    expect(all.body.items.length).toBe(5);
    expect(all.body.total).toBeGreaterThan(5);
    const powers = all.body.items.map((r: { peakPowerHp: number }) => r.peakPowerHp);
    expect([...powers].sort((x, y) => y - x)).toEqual(powers);
    const page2 = await desk.get('/api/runs').query({ bikeId: a.bike.id, status: 'ready', sort: '-peakPowerHp', pageSize: 5, page: 2 });
    expect(page2.body.items[0].peakPowerHp).toBeLessThanOrEqual(powers[4]);
    expect(new Set([...all.body.items, ...page2.body.items].map((r: { id: string }) => r.id)).size).toBe(all.body.items.length + page2.body.items.length);
    const byCustomer = await desk.get('/api/runs').query({ customerId: a.customer.id, pageSize: 200 });
    expect(byCustomer.body.items.every((r: { bikeId: string }) => r.bikeId === a.bike.id)).toBe(true);
    const search = await desk.get('/api/runs').query({ q: 'pull-3' });
    expect(search.body.items.map((r: { originalName: string }) => r.originalName)).toEqual(['pull-3.csv']);
    expect((await desk.get('/api/runs').query({ sort: 'rawKey' })).status).toBe(400);
  });

  it('edits tags, note and stage, soft-deletes and restores, and writes the audit log', async () => {
    const list = await desk.get('/api/runs').query({ q: 'pull-1.csv' });
    const id = list.body.items[0].id;
    const stage = await tuner.post('/api/stages').send({ bikeId: a.bike.id, name: 'Baseline' });
    const edited = await tuner.patch(`/api/runs/${id}`).send({ tags: ['baseline', 'hot day', 'baseline'], note: 'Fan on, second gear', stageId: stage.body.id, label: 'Pull one' });
    expect(edited.status).toBe(200);
    expect(edited.body).toMatchObject({ tags: ['baseline', 'hot day'], note: 'Fan on, second gear', stageId: stage.body.id, stageName: 'Baseline', label: 'Pull one' });
    const tagged = await desk.get('/api/runs').query({ tag: 'hot day' });
    expect(tagged.body.items.map((r: { id: string }) => r.id)).toEqual([id]);
    expect((await desk.patch(`/api/runs/${id}`).send({ note: 'x' })).status).toBe(403);
    expect((await tuner.patch(`/api/runs/${id}`).send({ stageId: b.bike.id })).status).toBe(404);

    expect((await tuner.delete(`/api/runs/${id}`)).status).toBe(403);
    const del = await owner.delete(`/api/runs/${id}`);
    expect(del.status).toBe(200);
    expect(del.body.deletedAt).toBeTruthy();
    expect((await desk.get(`/api/runs/${id}`)).status).toBe(404);
    expect((await desk.get('/api/runs').query({ q: 'pull-1.csv' })).body.items).toHaveLength(0);
    expect((await owner.get('/api/runs').query({ q: 'pull-1.csv', includeDeleted: 'true' })).body.items).toHaveLength(1);
    expect((await owner.get('/api/runs').query({ q: 'pull-1.csv', includeDeleted: 'false' })).body.items).toHaveLength(0);
    const restored = await owner.post(`/api/runs/${id}/restore`);
    expect(restored.status).toBe(200);
    expect(restored.body.deletedAt).toBeNull();
    expect((await desk.get(`/api/runs/${id}`)).status).toBe(200);

    const audit = await owner.get('/api/audit').query({ limit: 500 });
    const actions = audit.body.items.filter((e: { entityId: string }) => e.entityId === id).map((e: { action: string }) => e.action);
    expect(actions).toEqual(expect.arrayContaining(['run.upload', 'run.update', 'run.delete', 'run.restore']));
    expect(audit.body.items.some((e: { action: string }) => e.action === 'column-layout.create')).toBe(true);
  });

  it('hides deleted runs from staff when includeDeleted=false (the text "false" means false)', async () => {
    const up = await upload(tuner, a.otherBike.id, [{ name: 'deleted-listing.csv', bytes: file(4242) }]);
    expect(up.status).toBe(201);
    const id = up.body.results[0].run.id;
    expect((await owner.delete(`/api/runs/${id}`)).status).toBe(200);
    try {
      const q = { q: 'deleted-listing.csv' };
      expect((await owner.get('/api/runs').query({ ...q, includeDeleted: 'true' })).body.items.map((r: { id: string }) => r.id)).toEqual([id]);
      for (const flag of ['false', '0', 'no']) {
        const res = await owner.get('/api/runs').query({ ...q, includeDeleted: flag });
        expect(res.status).toBe(200);
        expect(res.body).toMatchObject({ items: [], total: 0 });
      }
      // Only an owner may list deleted runs; other staff never see them, whatever they ask.
      for (const agent of [tuner, desk]) {
        expect((await agent.get('/api/runs').query({ ...q, includeDeleted: 'false' })).body.items).toEqual([]);
        expect((await agent.get('/api/runs').query({ ...q, includeDeleted: 'true' })).body.items).toEqual([]);
      }
      expect((await owner.get('/api/runs').query({ ...q, includeDeleted: 'maybe' })).status).toBe(400);
    } finally {
      await owner.post(`/api/runs/${id}/restore`);
    }
  });

  it('lets a customer read only their own bikes’ runs, never the raw file', async () => {
    const own = await customer.get('/api/runs').query({ pageSize: 200 });
    expect(own.status).toBe(200);
    expect(own.body.items.length).toBeGreaterThan(0);
    expect(own.body.items.every((r: { bikeId: string }) => r.bikeId === a.bike.id)).toBe(true);
    const ownId = own.body.items[0].id;
    expect((await customer.get(`/api/runs/${ownId}`)).status).toBe(200);
    expect((await customer.get(`/api/runs/${ownId}/raw`)).status).toBe(403);
    expect((await customer.get(`/api/runs/${ownId}/preview`)).status).toBe(403);
    const others = await desk.get('/api/runs').query({ bikeId: a.otherBike.id });
    const otherId = others.body.items[0].id;
    expect((await customer.get(`/api/runs/${otherId}`)).status).toBe(404);
    expect((await customer.get('/api/runs').query({ bikeId: a.otherBike.id })).body.items).toHaveLength(0);
    expect((await customer.post('/api/runs').field('bikeId', a.bike.id)).status).toBe(403);
  });

  it('keeps each shop’s runs to itself on every route', async () => {
    const runId = (await desk.get('/api/runs').query({ bikeId: a.bike.id })).body.items[0].id;
    const bOwner = await t.signIn(b.users.owner);
    const bTuner = await t.signIn(b.users.tuner);
    expect((await bOwner.get('/api/runs').query({ pageSize: 200 })).body.items).toHaveLength(0);
    expect((await bOwner.get(`/api/runs/${runId}`)).status).toBe(404);
    expect((await bOwner.get(`/api/runs/${runId}/raw`)).status).toBe(404);
    expect((await bOwner.get(`/api/runs/${runId}/preview`)).status).toBe(404);
    expect((await bTuner.patch(`/api/runs/${runId}`).send({ note: 'x' })).status).toBe(404);
    expect((await bOwner.delete(`/api/runs/${runId}`)).status).toBe(404);
    expect((await bOwner.post(`/api/runs/${runId}/restore`)).status).toBe(404);
    expect((await bTuner.post(`/api/runs/${runId}/reprocess`)).status).toBe(404);
    expect((await bTuner.post(`/api/runs/${runId}/mapping`).send({ mapping: { rpm: 'x', torque: { column: 'y', unit: 'lbft' } } })).status).toBe(404);
    expect((await upload(bTuner, a.bike.id, [{ name: 'x.csv', bytes: file(900) }])).status).toBe(404);
    expect((await bOwner.get('/api/column-layouts')).body.items).toEqual([]);
  });
});

describe('command-line pipeline (import and reprocess)', () => {
  it('imports a folder into a stage it creates, through the same pipeline, and skips files already there', async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'pullbook-import-'));
    try {
      fs.writeFileSync(path.join(dir, 'old-1.csv'), file(1000));
      fs.writeFileSync(path.join(dir, 'old-2.csv'), file(1001));
      fs.writeFileSync(path.join(dir, 'broken.csv'), Buffer.from('Engine Speed [rpm],Torque [lb-ft]\n'));
      const out = await importFolder(t.deps, { bikeId: a.otherBike.id, stageName: 'Imported baseline', dir });
      expect(out.created).toBe(true);
      const stageAudit = (await owner.get('/api/audit').query({ limit: 500 })).body.items.filter((e: { action: string; entityId: string }) => e.action === 'stage.create' && e.entityId === out.stageId);
      expect(stageAudit).toMatchObject([{ userName: a.users.owner.name, details: { via: 'command line import', name: 'Imported baseline' } }]);
      expect(out.results.map((r) => [r.file, r.ok])).toEqual([['broken.csv', false], ['old-1.csv', true], ['old-2.csv', true]]);
      const stage = await t.deps.orm.em.fork().findOneOrFail(Stage, { id: out.stageId });
      expect(stage.name).toBe('Imported baseline');
      const runs = await t.deps.orm.em.fork().find(Run, { stage: out.stageId });
      expect(runs).toHaveLength(3);
      for (const r of runs) expect(sha(await t.deps.storage.getBuffer(r.rawKey))).toBe(r.rawSha256);
      const again = await importFolder(t.deps, { bikeId: a.otherBike.id, stageName: 'Imported baseline', dir });
      expect(again.created).toBe(false);
      // Every file, the unreadable one too, is already in the archive: nothing new is written.
      expect(again.results.map((r) => r.ok && r.duplicate)).toEqual([true, true, true]);
      expect(await t.deps.orm.em.fork().count(Run, { stage: out.stageId })).toBe(3);
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });

  it('re-derives every run from its raw file, reports what changed, and changes nothing else', async () => {
    const em = t.deps.orm.em.fork();
    const victim = await em.findOneOrFail(Run, { bike: a.bike.id, status: 'ready', deletedAt: null }, { orderBy: { createdAt: 'asc' } });
    const truePeak = victim.peakPowerHp!;
    await em.nativeUpdate(Run, { id: victim.id }, { peakPowerHp: 1 });
    const lines = await reprocessAll(t.deps);
    expect(lines.length).toBe(await em.count(Run, {}));
    expect(lines.filter((l) => l.error)).toEqual([]);
    const changed = lines.filter((l) => l.changes.length);
    expect(changed.map((l) => l.runId)).toContain(victim.id);
    // A session's conditions were edited after its upload (above): its other run follows them now.
    for (const l of changed.filter((x) => x.runId !== victim.id)) expect(l.changes.map((c) => c.field)).toContain('correctionFactor');
    // Re-deriving is deterministic: a second pass changes nothing.
    expect((await reprocessAll(t.deps)).filter((l) => l.changes.length)).toEqual([]);
    expect(changed.find((l) => l.runId === victim.id)!.changes).toEqual([{ field: 'peakPowerHp', before: 1, after: Number(truePeak.toFixed(2)) }]);
    const fixed = await t.deps.orm.em.fork().findOneOrFail(Run, { id: victim.id });
    expect(fixed.peakPowerHp).toBeCloseTo(truePeak, 9);
    // The command line acts as the shop's owner: the change is in the audit log under their name.
    const audit = await owner.get('/api/audit').query({ limit: 500 });
    const entries = audit.body.items.filter((e: { action: string; entityId: string; details: { via?: string } | null }) => e.action === 'run.reprocess' && e.entityId === victim.id && e.details?.via === 'command line');
    expect(entries).toHaveLength(1);
    expect(entries[0]).toMatchObject({ userName: a.users.owner.name, details: { via: 'command line', changes: [{ field: 'peakPowerHp', before: 1, after: Number(truePeak.toFixed(2)) }] } });
  });
});
