/**
 * Chaos: the app (a child process, server/index.ts) on services of this file's own — PostgreSQL,
 * the S3 fake and the SMTP fake — each stopped and started again under it, and the app itself
 * killed with SIGKILL mid-upload and started again. At the end: no lost mail, no orphan object,
 * no orphan row, and not one 500 answer.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freePort, startLocalPostgres, startS3Fake, startSmtpFake, type PostgresOptions, type RunningService } from '../../scripts/lib/local-services';
import { initOrm, migrateToLatest, type Orm } from '@server/db/orm';
import { createTestApp, TEST_PASSWORD, type TestApp, type TestShop } from '../support/test-app';
import { client, startChildApp, type ChildApp } from '../support/child-app';
import { latestMailTo } from '../support/mail';
import { syntheticRunFile } from '@server/db/synthetic-runs';
import { rawKeyFor } from '@server/modules/runs/raw-store';

const base = fs.mkdtempSync(path.join(os.tmpdir(), 'pb-chaos-'));
const s3Dir = path.join(base, 's3');
const mailDir = path.join(base, 'mail');
const tmpDir = path.join(base, 'uploads');
let pgOpts: PostgresOptions;
let pg: Awaited<ReturnType<typeof startLocalPostgres>>;
let s3: Awaited<ReturnType<typeof startS3Fake>>;
let smtp: RunningService;
let s3Port = 0;
let smtpPort = 0;
let seed: TestApp;
let orm: Orm;
let s: TestShop;
let app: ChildApp | null = null;
const statuses: { what: string; status: number }[] = [];
const sql = <T = Record<string, unknown>>(q: string, p: unknown[] = []) => orm.em.fork().getConnection().execute(q, p) as Promise<T[]>;

const env = () => ({
  DATABASE_URL: pg.url,
  S3_ENDPOINT: s3.url,
  S3_BUCKET: 'pullbook-chaos',
  S3_ACCESS_KEY_ID: s3.accessKeyId,
  S3_SECRET_ACCESS_KEY: s3.secretAccessKey,
  SMTP_URL: `smtp://127.0.0.1:${smtpPort}`,
  MAIL_CAPTURE_DIR: mailDir,
  MAIL_RETRY_DELAY_SECONDS: '1',
  MAIL_RETRY_LIMIT: '12',
  UPLOAD_TMP_DIR: tmpDir,
  ORPHAN_GRACE_SECONDS: '0',
  UPLOAD_TMP_GRACE_SECONDS: '0',
  RECONCILE_EVERY_SECONDS: '0',
});

async function waitFor<T>(fn: () => Promise<T>, ok: (v: T) => boolean, what: string, ms = 60_000): Promise<T> {
  const t0 = Date.now();
  for (;;) {
    const v = await fn().catch(() => undefined as T);
    if (v !== undefined && ok(v)) return v;
    if (Date.now() - t0 > ms) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

beforeAll(async () => {
  pgOpts = { baseDir: path.join(base, 'pg'), port: await freePort(), database: 'pullbook_chaos', label: `chaos-postgres-${process.pid}` };
  pg = await startLocalPostgres(pgOpts);
  orm = await initOrm(pg.url, { poolMax: 2 });
  await migrateToLatest(orm);
  s3Port = await freePort();
  smtpPort = await freePort();
  s3 = await startS3Fake({ dir: s3Dir, port: s3Port, bucket: 'pullbook-chaos' });
  smtp = await startSmtpFake({ dir: mailDir, port: smtpPort });
  seed = await createTestApp({ databaseUrl: pg.url, workers: false, env: { S3_ENDPOINT: s3.url, S3_BUCKET: 'pullbook-chaos', SMTP_URL: `smtp://127.0.0.1:${smtpPort}` } });
  s = await seed.createShop('Chaos Garage');
  app = await startChildApp(env());
}, 180_000);

afterAll(async () => {
  await app?.stop().catch(() => undefined);
  await seed?.close().catch(() => undefined);
  await orm?.close().catch(() => undefined);
  await smtp?.stop().catch(() => undefined);
  await s3?.stop().catch(() => undefined);
  await pg?.stop().catch(() => undefined);
  fs.rmSync(base, { recursive: true, force: true });
}, 60_000);

const record = <T extends { status: number }>(what: string, r: T) => (statuses.push({ what, status: r.status }), r);

describe('chaos', () => {
  it('survives the mail relay, the object store and the database going away, and a kill -9 mid-upload', async () => {
    const owner = client(app!.url);
    expect(record('login', await owner.post('/api/auth/login', { email: s.users.owner.email, password: TEST_PASSWORD })).status).toBe(200);

    // 1. The mail relay goes away: a reset and an invitation are still answered, and queued.
    await smtp.stop();
    expect(record('forgot', await client(app!.url).post('/api/auth/forgot', { email: s.users.tuner.email })).status).toBe(202);
    expect(record('invite', await owner.post('/api/users', { email: 'chaos.new@chaos.test', name: 'Chaos New', role: 'desk' })).status).toBe(201);

    // 2. The object store goes away: an upload is refused with 503, nothing half-saved.
    await s3.stop();
    const bytes = Buffer.from(syntheticRunFile({ seed: 5 }).bytes);
    const form = () => {
      const f = new FormData();
      f.append('bikeId', s.bike.id);
      f.append('files', new Blob([bytes], { type: 'text/csv' }), 'chaos.csv');
      return f;
    };
    const refused = record('upload, storage down', await owner.post('/api/runs', form()));
    expect(refused.status).toBe(503);
    s3 = await startS3Fake({ dir: s3Dir, port: s3Port, bucket: 'pullbook-chaos' });

    // 3. The database goes away and comes back: 503 meanwhile, then the session works again.
    await pg.stop();
    expect(record('me, database down', await owner.get('/api/auth/me')).status).toBe(503);
    pg = await startLocalPostgres(pgOpts);
    await waitFor(() => owner.get('/api/auth/me'), (r) => record('me, database back', r).status === 200, 'the app to recover');

    // 4. The relay returns: every queued message goes out, once.
    smtp = await startSmtpFake({ dir: mailDir, port: smtpPort });
    // The mail helper reads the folder from MAIL_CAPTURE_DIR: this file's SMTP fake, for now.
    const runMailDir = process.env.MAIL_CAPTURE_DIR;
    process.env.MAIL_CAPTURE_DIR = mailDir;
    try {
      expect((await latestMailTo(s.users.tuner.email, 90_000)).text).toContain('/reset-password/');
      expect((await latestMailTo('chaos.new@chaos.test', 90_000)).text).toContain('/invite/');
    } finally {
      process.env.MAIL_CAPTURE_DIR = runMailDir;
    }

    // 5. Kill -9 mid-upload (held between the stored object and the run's insert), then restart.
    const key = rawKeyFor(s.shop.id, s.bike.id, createHash('sha256').update(bytes).digest('hex'));
    await sql(`create or replace function pb_chaos_hold() returns trigger language plpgsql as $$ begin perform pg_sleep(6); return new; end $$`);
    await sql(`create trigger pb_chaos_hold before insert on run for each row execute function pb_chaos_hold()`);
    try {
      const pending = owner.post('/api/runs', form()).catch(() => null);
      await waitFor(async () => (await sql<{ n: string }>(`select count(*) as n from object_write where key = ?`, [key]))[0].n, (n) => Number(n) === 1, 'the write journaled');
      await new Promise((r) => setTimeout(r, 500));
      await app!.kill();
      await pending;
    } finally {
      await sql(`drop trigger if exists pb_chaos_hold on run`);
    }
    app = await startChildApp(env());
    const again = client(app.url);
    expect(record('login after restart', await again.post('/api/auth/login', { email: s.users.owner.email, password: TEST_PASSWORD })).status).toBe(200);

    // The end state.
    const mail = await sql<{ status: string; n: string }>(`select status, count(*) as n from mail_message group by status`);
    expect(mail.filter((m) => m.status !== 'sent')).toEqual([]);
    expect(Number((await sql<{ n: string }>(`select count(*) as n from run`))[0].n)).toBe(0);
    expect(Number((await sql<{ n: string }>(`select count(*) as n from object_write`))[0].n)).toBe(0);
    expect(Number((await sql<{ n: string }>(`select count(*) as n from orphan_object`))[0].n)).toBe(0);
    expect(await seed.deps.storage.exists(key)).toBe(false);
    expect(fs.existsSync(tmpDir) ? fs.readdirSync(tmpDir) : []).toEqual([]);
    expect(statuses.filter((x) => x.status >= 500 && x.status !== 503)).toEqual([]);
    expect(app.output()).not.toMatch(/"status":500/);
  }, 300_000);
});
