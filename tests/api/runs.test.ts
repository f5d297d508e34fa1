import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';
import { modelPeaks, syntheticRunFile } from '../support/synthetic-runs';
import { SAFETY_CHECKS } from '@shared/schemas/run';
import { Run } from '@server/modules/runs/run.entity';
import { OrphanObject } from '@server/lib/storage/orphan-object.entity';
import { reconcileOrphanObjects } from '@server/modules/runs/orphan-reconcile';
import { rawKeyFor } from '@server/modules/runs/run-ingest';

/**
 * Run archive API against the real PostgreSQL and the S3 fake. Run files come from the invented
 * engine model of tests/support/synthetic-runs.ts (known answers) and from sample-data/.
 */
let t: TestApp;
let a: TestShop;
let b: TestShop;
type Agent = ReturnType<typeof supertest.agent>;
let tuner: Agent;
let owner: Agent;
let desk: Agent;
let customer: Agent;

const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');
const file = (seed: number, opts: Parameters<typeof syntheticRunFile>[0] = {}, fmt: Parameters<typeof syntheticRunFile>[1] = {}) => Buffer.from(syntheticRunFile({ seed, ...opts }, fmt).bytes);
const SAMPLE = path.join(process.cwd(), 'sample-data');

function upload(agent: Agent, bikeId: string, files: { name: string; bytes: Buffer }[], extra: Record<string, string> = {}) {
  let req = agent.post('/api/runs').field('bikeId', bikeId);
  for (const [k, v] of Object.entries(extra)) req = req.field(k, v);
  for (const f of files) req = req.attach('files', f.bytes, { filename: f.name, contentType: 'text/csv' });
  return req;
}

/** Binary download as a Buffer (supertest parses only text by default). */
function download(agent: Agent, url: string) {
  return agent
    .get(url)
    .buffer(true)
    .parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    });
}

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
