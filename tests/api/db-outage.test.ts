/**
 * PostgreSQL going away under a running app: a cluster of this file's own (the run's shared
 * cluster is used by other files at the same time) is stopped and started again on the same
 * port and data directory while a signed-in session is open.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freePort, startLocalPostgres, type PostgresOptions } from '../../scripts/lib/local-services';
import { initOrm, migrateToLatest } from '@server/db/orm';
import { createTestApp, type TestApp } from '../support/test-app';

let baseDir: string;
let clientDir: string;
let pgOpts: PostgresOptions;
let cluster: Awaited<ReturnType<typeof startLocalPostgres>> | undefined;
let t: TestApp | undefined;

beforeAll(async () => {
  baseDir = fs.mkdtempSync(path.join(os.tmpdir(), 'pb-outage-pg-'));
  clientDir = fs.mkdtempSync(path.join(os.tmpdir(), 'pb-outage-client-'));
  fs.writeFileSync(path.join(clientDir, 'index.html'), '<!doctype html><title>Pullbook shell</title>');
  pgOpts = { baseDir, port: await freePort(), database: 'pullbook_outage', label: `outage-postgres-${process.pid}` };
  cluster = await startLocalPostgres(pgOpts);
  const orm = await initOrm(cluster.url, { poolMax: 2 });
  await migrateToLatest(orm);
  await orm.close();
  t = await createTestApp({ databaseUrl: cluster.url, clientDir });
}, 120_000);

afterAll(async () => {
  await t?.close().catch(() => undefined);
  await cluster?.stop();
  if (cluster && !cluster.dataDir.startsWith(baseDir)) fs.rmSync(path.dirname(path.dirname(cluster.dataDir)), { recursive: true, force: true });
  fs.rmSync(baseDir, { recursive: true, force: true });
  fs.rmSync(clientDir, { recursive: true, force: true });
}, 60_000);

describe('database outage', () => {
  it('answers 503 while PostgreSQL is down, keeps serving the app shell, and recovers when it returns', async () => {
    const app = t!;
    const s = await app.createShop('Outage Garage');
    const agent = await app.signIn(s.users.owner);
    expect((await agent.get('/api/auth/me')).status).toBe(200);
    expect((await agent.get('/api/customers')).status).toBe(200);

    await cluster!.stop();

    const me = await agent.get('/api/auth/me');
    expect(me.status).toBe(503);
    expect(me.body.error.code).toBe('DATABASE_UNAVAILABLE');
    const customers = await agent.get('/api/customers');
    expect(customers.status).toBe(503);
    expect(customers.body.error.code).toBe('DATABASE_UNAVAILABLE');
    const health = await app.request.get('/api/health');
    expect(health.status).toBe(503);
    expect(health.body.database.ok).toBe(false);
    const shell = await agent.get('/runs');
    expect(shell.status).toBe(200);
    expect(shell.text).toContain('Pullbook shell');
    // Idle pooled connections were cut; give their 'error' events time to arrive.
    await new Promise((r) => setTimeout(r, 500));
    expect((await agent.get('/api/auth/me')).status).toBe(503);

    cluster = await startLocalPostgres(pgOpts);

    let status = 0;
    const deadline = Date.now() + 20_000;
    while (Date.now() < deadline) {
      status = (await agent.get('/api/auth/me')).status;
      if (status === 200) break;
      await new Promise((r) => setTimeout(r, 250));
    }
    expect(status).toBe(200);
    expect((await agent.get('/api/customers')).status).toBe(200);
    expect((await app.request.get('/api/health')).status).toBe(200);
  }, 90_000);
});
