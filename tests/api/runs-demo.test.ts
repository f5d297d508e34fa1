import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../support/test-app';
import { seedDemoIfEmpty, type DemoIds } from '@server/db/demo-seed';
import '@server/db/demo-archive';
import { Run } from '@server/modules/runs/run.entity';
import { Stage } from '@server/modules/stages/stage.entity';
import { DEMO_PASSWORD } from '@server/db/demo-seed';

/** The demo archive goes through the real pipeline: raw files in storage, stages with gains. */
let t: TestApp;
let ids: DemoIds;

beforeAll(async () => {
  t = await createTestApp();
  ids = (await seedDemoIfEmpty(t.deps))!;
}, 120_000);
afterAll(() => t.close());

describe('demo archive', () => {
  it('has several bikes with a build history, reference runs, costs and growing gains', async () => {
    expect(ids).toBeTruthy();
    const em = t.deps.orm.em.fork();
    const stages = await em.find(Stage, { shop: ids.shopId }, { orderBy: { bike: 'asc', position: 'asc' } });
    const byBike = new Map<string, Stage[]>();
    for (const s of stages) byBike.set(s.bike.id, [...(byBike.get(s.bike.id) ?? []), s]);
    expect(byBike.size).toBeGreaterThanOrEqual(4);
    const full = [...byBike.values()].filter((list) => list.length === 4);
    expect(full.length).toBeGreaterThanOrEqual(2);
    for (const list of full) {
      expect(list.every((s) => s.referenceRun)).toBe(true);
      expect(list[0].gainPeakPowerHp).toBeNull();
      const gains = list.slice(1).map((s) => s.gainPeakPowerHp!);
      // Each stage of the invented build adds torque, so the gains over baseline grow.
      expect([...gains].sort((x, y) => x - y)).toEqual(gains);
      expect(gains[0]).toBeGreaterThan(2);
      expect(list.slice(1).every((s) => s.totalCostCents > 0)).toBe(true);
    }
  });

  it('stores every demo run’s raw file in object storage, byte for byte', async () => {
    const runs = await t.deps.orm.em.fork().find(Run, { shop: ids.shopId });
    expect(runs.length).toBeGreaterThan(30);
    expect(runs.filter((r) => r.status === 'ready').length).toBe(runs.length);
    for (const r of runs.slice(0, 8)) {
      const bytes = await t.deps.storage.getBuffer(r.rawKey);
      expect(createHash('sha256').update(bytes).digest('hex')).toBe(r.rawSha256);
    }
  });

  it('leaves two saved comparisons and a stored gain report the demo customer can open', async () => {
    const tuner = await t.signIn('tuner@demo.pullbook.test', DEMO_PASSWORD);
    const comparisons = await tuner.get('/api/comparisons').query({ bikeId: ids.bikes[0].id });
    expect(comparisons.status).toBe(200);
    expect(comparisons.body.items).toHaveLength(2);
    const customer = await t.signIn('customer@demo.pullbook.test', DEMO_PASSWORD);
    const reports = await customer.get('/api/reports');
    expect(reports.status).toBe(200);
    expect(reports.body.items).toHaveLength(1);
    const pdf = await customer.get(`/api/reports/${reports.body.items[0].id}/pdf`).buffer(true);
    expect(pdf.status).toBe(200);
    expect(pdf.body.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const detail = await tuner.get(`/api/comparisons/${comparisons.body.items[0].id}`);
    expect(detail.body.previewError).toBeNull();
    expect(detail.body.preview.results[0].peakPowerGain.hp).toBeGreaterThan(0);
  });
});
