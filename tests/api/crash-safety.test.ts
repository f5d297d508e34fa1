/**
 * Crash safety: the app is a child process (server/index.ts) killed with SIGKILL between storing
 * an object and committing its row — mid-upload and mid-report-creation — then started again.
 * The start-up reconciliation leaves no stored object without its row, no row without its object,
 * and no temporary upload file. A trigger that sleeps before the row's insert holds the process
 * exactly in that window.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, TEST_PASSWORD, type TestApp, type TestShop } from '../support/test-app';
import { client, startChildApp, type ChildApp } from '../support/child-app';
import { seedReportScenario } from '../support/report-fixtures';
import { syntheticRunFile } from '@server/db/synthetic-runs';
import { rawKeyFor } from '@server/modules/runs/raw-store';

let t: TestApp;
let s: TestShop;
let child: ChildApp | null = null;
const tmpDir = fs.mkdtempSync(path.join(os.tmpdir(), 'pb-crash-'));
const sql = <T = Record<string, unknown>>(q: string, p: unknown[] = []) => t.deps.orm.em.fork().getConnection().execute(q, p) as Promise<T[]>;
const childEnv = () => ({ DATABASE_URL: t.deps.config.DATABASE_URL, UPLOAD_TMP_DIR: tmpDir, ORPHAN_GRACE_SECONDS: '0', UPLOAD_TMP_GRACE_SECONDS: '0', RECONCILE_EVERY_SECONDS: '0' });

async function waitFor<T>(fn: () => Promise<T>, ok: (v: T) => boolean, what: string, ms = 30_000): Promise<T> {
  const t0 = Date.now();
  for (;;) {
    const v = await fn();
    if (ok(v)) return v;
    if (Date.now() - t0 > ms) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** A trigger that holds every insert into `table` for `seconds` (the process sits between object and row). */
async function holdInserts(table: string, seconds: number) {
  await sql(`create or replace function pb_test_hold() returns trigger language plpgsql as $$ begin perform pg_sleep(${seconds}); return new; end $$`);
  await sql(`create trigger pb_test_hold before insert on "${table}" for each row execute function pb_test_hold()`);
}
const releaseInserts = (table: string) => sql(`drop trigger if exists pb_test_hold on "${table}"`);

beforeAll(async () => {
  t = await createTestApp({ workers: false });
  s = await t.createShop('Crash Shop');
}, 60_000);
afterAll(async () => {
  await child?.kill();
  await t.close();
  fs.rmSync(tmpDir, { recursive: true, force: true });
});

describe('kill -9 between the object and its row', () => {
  it('mid-upload: after a restart neither the stored file nor a temporary file is left', async () => {
    child = await startChildApp(childEnv());
    const c = client(child.url);
    expect((await c.post('/api/auth/login', { email: s.users.tuner.email, password: TEST_PASSWORD })).status).toBe(200);
    const bytes = Buffer.from(syntheticRunFile({ seed: 77 }).bytes);
    const key = rawKeyFor(s.shop.id, s.bike.id, createHash('sha256').update(bytes).digest('hex'));
    await holdInserts('run', 8);
    try {
      const form = new FormData();
      form.append('bikeId', s.bike.id);
      form.append('files', new Blob([bytes], { type: 'text/csv' }), 'crash.csv');
      const pending = c.post('/api/runs', form).catch(() => null);
      // The object is stored, the run's insert is waiting: kill now.
      await waitFor(() => t.deps.storage.exists(key), (x) => x, 'the raw file stored');
      await new Promise((r) => setTimeout(r, 300));
      expect(fs.readdirSync(tmpDir).length).toBeGreaterThan(0);
      await child.kill();
      await pending;
    } finally {
      await releaseInserts('run');
    }
    expect(await t.deps.storage.exists(key)).toBe(true);
    // Restart: the start-up reconciliation cleans up.
    child = await startChildApp(childEnv());
    expect(await t.deps.storage.exists(key)).toBe(false);
    expect(Number((await sql<{ n: string }>(`select count(*) as n from run where bike_id = ?`, [s.bike.id]))[0].n)).toBe(0);
    expect(Number((await sql<{ n: string }>(`select count(*) as n from object_write`))[0].n)).toBe(0);
    expect(fs.readdirSync(tmpDir)).toEqual([]);
    // And the same file uploads cleanly afterwards (no duplicate of a half-stored run).
    const again = client(child.url);
    await again.post('/api/auth/login', { email: s.users.tuner.email, password: TEST_PASSWORD });
    const form = new FormData();
    form.append('bikeId', s.bike.id);
    form.append('files', new Blob([bytes], { type: 'text/csv' }), 'crash.csv');
    const res = await again.post('/api/runs', form);
    expect(res.status).toBe(201);
    expect(await t.deps.storage.exists(key)).toBe(true);
    await child.stop();
    child = null;
  }, 120_000);

  it('mid-report-creation: after a restart no PDF without its report row is left', async () => {
    const scenario = await seedReportScenario(t, s);
    child = await startChildApp(childEnv());
    const c = client(child.url);
    expect((await c.post('/api/auth/login', { email: s.users.desk.email, password: TEST_PASSWORD })).status).toBe(200);
    await holdInserts('report', 8);
    let pdfKey = '';
    try {
      const pending = c.post('/api/reports', { comparisonId: scenario.comparisonId }).catch(() => null);
      const [w] = await waitFor(() => sql<{ key: string }>(`select key from object_write where key like '%/reports/%'`), (r) => r.length > 0, 'the PDF write journaled');
      pdfKey = w.key;
      await waitFor(() => t.deps.storage.exists(pdfKey), (x) => x, 'the PDF stored');
      await child.kill();
      await pending;
    } finally {
      await releaseInserts('report');
    }
    expect(await t.deps.storage.exists(pdfKey)).toBe(true);
    child = await startChildApp(childEnv());
    expect(await t.deps.storage.exists(pdfKey)).toBe(false);
    expect(Number((await sql<{ n: string }>(`select count(*) as n from report where shop_id = ?`, [s.shop.id]))[0].n)).toBe(0);
    // The same report can be made now (a leftover PDF would answer 409 REPORT_VERSION_EXISTS).
    const again = client(child.url);
    await again.post('/api/auth/login', { email: s.users.desk.email, password: TEST_PASSWORD });
    expect((await again.post('/api/reports', { comparisonId: scenario.comparisonId })).status).toBe(201);
    await child.stop();
    child = null;
  }, 120_000);
});
