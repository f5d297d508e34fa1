import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';
import { seedReportScenario } from '../support/report-fixtures';
import { OrphanObject } from '@server/lib/storage/orphan-object.entity';
import { reconcileOrphanObjects } from '@server/modules/runs/orphan-reconcile';
import { Report } from '@server/modules/reports/report.entity';
import { Shop } from '@server/modules/shops/shop.entity';

/**
 * Objects stored for a row that never committed (here a report's PDF) are removed, and the
 * start-up reconciliation never removes an object a report or a shop logo still points to.
 */
let t: TestApp;
let a: TestShop;
let scenario: Awaited<ReturnType<typeof seedReportScenario>>;

beforeAll(async () => {
  t = await createTestApp();
  a = await t.createShop('Orphans Alpha');
  scenario = await seedReportScenario(t, a);
});
afterAll(() => t.close());

describe('report PDFs whose row did not commit', () => {
  it('removes the stored PDF when the report insert fails, so the same version can be made later', async () => {
    const desk = await t.signIn(a.users.desk);
    const conn = t.deps.orm.em.getConnection();
    await conn.execute(`create or replace function pb_test_refuse_report() returns trigger language plpgsql as $$ begin raise exception 'simulated database failure'; end $$`);
    await conn.execute(`create trigger pb_test_refuse_report before insert on report for each row execute function pb_test_refuse_report()`);
    const puts: string[] = [];
    const original = t.deps.storage.put.bind(t.deps.storage);
    t.deps.storage.put = async (key, body, opts) => {
      puts.push(key);
      return original(key, body, opts);
    };
    try {
      const failed = await desk.post('/api/reports').send({ comparisonId: scenario.comparisonId });
      expect(failed.status).toBeGreaterThanOrEqual(500);
    } finally {
      t.deps.storage.put = original;
      await conn.execute(`drop trigger pb_test_refuse_report on report`);
    }
    // The PDF did reach storage before the insert failed, and is gone again.
    const pdfKeys = puts.filter((k) => k.endsWith('.pdf'));
    expect(pdfKeys).toHaveLength(1);
    expect(await t.deps.storage.exists(pdfKeys[0])).toBe(false);
    expect(await t.deps.orm.em.fork().count(Report, {})).toBe(0);
    // Left behind, the object would make this answer 409 REPORT_VERSION_EXISTS.
    const ok = await desk.post('/api/reports').send({ comparisonId: scenario.comparisonId });
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
    expect(ok.body.version).toBe(1);
    const row = await t.deps.orm.em.fork().findOneOrFail(Report, { id: ok.body.id });
    expect(row.pdfKey).toBe(pdfKeys[0]);
  }, 30_000);
});

describe('start-up reconciliation', () => {
  it('keeps objects a report row or a shop logo points to and removes the rest', async () => {
    const em = t.deps.orm.em.fork();
    const report = await em.findOneOrFail(Report, { shop: a.shop.id });
    const logoKey = `shops/${a.shop.id}/logo/orphan-test.png`;
    await t.deps.storage.put(logoKey, Buffer.from('logo bytes'), { contentType: 'image/png' });
    await em.nativeUpdate(Shop, { id: a.shop.id }, { logoKey });
    const strayKey = `shops/${a.shop.id}/reports/R-0000-0000/v1.pdf`;
    await t.deps.storage.put(strayKey, Buffer.from('stray'), { contentType: 'application/pdf' });
    for (const key of [report.pdfKey, logoKey, strayKey]) em.create(OrphanObject, { key, reason: 'test' } as OrphanObject);
    await em.flush();
    const r = await reconcileOrphanObjects(t.deps);
    expect(r).toMatchObject({ removed: 1, kept: 2, failed: 0 });
    expect(await t.deps.storage.exists(report.pdfKey)).toBe(true);
    expect(await t.deps.storage.exists(logoKey)).toBe(true);
    expect(await t.deps.storage.exists(strayKey)).toBe(false);
    expect(await t.deps.orm.em.fork().count(OrphanObject, {})).toBe(0);
  });
});
