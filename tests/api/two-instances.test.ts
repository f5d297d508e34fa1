/**
 * Two app processes (server/index.ts) on one database, as behind a load balancer: a session made
 * on one works on the other, sign-in throttling counts across both, a queued mail is sent once,
 * and the start-up reconciliation run by both at once removes each orphan once.
 */
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { simpleParser } from 'mailparser';
import { createTestApp, TEST_PASSWORD, type TestApp, type TestShop } from '../support/test-app';
import { client, startChildApp, type ChildApp } from '../support/child-app';

let t: TestApp;
let s: TestShop;
let a: ChildApp;
let b: ChildApp;
const ORPHANS = 8;
const sql = <T = Record<string, unknown>>(q: string, p: unknown[] = []) => t.deps.orm.em.fork().getConnection().execute(q, p) as Promise<T[]>;
const orphanKey = (i: number) => `shops/${s.shop.id}/reports/R-TWO-${i}/v1.pdf`;

beforeAll(async () => {
  t = await createTestApp({ workers: false });
  s = await t.createShop('Two Instances');
  // Objects whose writes started and whose rows never came: the crash both instances will find.
  for (let i = 0; i < ORPHANS; i++) {
    await t.deps.storage.put(orphanKey(i), Buffer.from(`orphan ${i}`), { contentType: 'application/pdf' });
  }
  await sql(`update object_write set started_at = now() - interval '1 hour'`);
  const env = { DATABASE_URL: t.deps.config.DATABASE_URL, ORPHAN_GRACE_SECONDS: '60', RECONCILE_EVERY_SECONDS: '0' };
  [a, b] = await Promise.all([startChildApp(env), startChildApp(env)]);
}, 120_000);
afterAll(async () => {
  await Promise.all([a?.stop(), b?.stop()]);
  await t.close();
});

describe('two instances on one database', () => {
  it('reconciled at start-up by both at once: each orphan removed exactly once', async () => {
    for (let i = 0; i < ORPHANS; i++) expect(await t.deps.storage.exists(orphanKey(i))).toBe(false);
    const removedBy = (out: string) => [...out.matchAll(/(\d+) object\(s\) of unfinished writes removed/g)].reduce((n, m) => n + Number(m[1]), 0);
    expect(removedBy(a.output()) + removedBy(b.output())).toBe(ORPHANS);
    expect(Number((await sql<{ n: string }>('select count(*) as n from object_write'))[0].n)).toBe(0);
  });

  it('a session made on one instance works on the other', async () => {
    const c = client(a.url);
    expect((await c.post('/api/auth/login', { email: s.users.tuner.email, password: TEST_PASSWORD })).status).toBe(200);
    const me = await c.get('/api/auth/me', b.url);
    expect(me.status).toBe(200);
    expect(me.body.id).toBe(s.users.tuner.id);
  });

  it('sign-in throttling counts across both', async () => {
    const c = client(a.url);
    for (let i = 0; i < 5; i++) expect((await c.post('/api/auth/login', { email: s.users.customer.email, password: `wrong-${i}` }, i % 2 ? a.url : b.url)).status).toBe(401);
    expect((await c.post('/api/auth/login', { email: s.users.customer.email, password: 'wrong-5' }, a.url)).status).toBe(429);
    expect((await c.post('/api/auth/login', { email: s.users.customer.email, password: 'wrong-6' }, b.url)).status).toBe(429);
  });

  it('mail queued on either instance is sent exactly once', async () => {
    const recipients = [s.users.owner.email, s.users.desk.email];
    for (const [i, email] of recipients.entries()) {
      expect((await client(i % 2 ? a.url : b.url).post('/api/auth/forgot', { email })).status).toBe(202);
    }
    const t0 = Date.now();
    let rows: { recipient: string; status: string; attempts: number }[] = [];
    while (Date.now() - t0 < 30_000) {
      rows = await sql(`select recipient, status, attempts from mail_message where shop_id = ?`, [s.shop.id]);
      if (rows.length === recipients.length && rows.every((r) => r.status === 'sent')) break;
      await new Promise((r) => setTimeout(r, 250));
    }
    expect(rows.map((r) => [r.status, r.attempts])).toEqual(recipients.map(() => ['sent', 1]));
    // Two workers polled the same queue; the mail catcher got one copy per message.
    await new Promise((r) => setTimeout(r, 2000));
    const dir = process.env.MAIL_CAPTURE_DIR!;
    const counts = new Map<string, number>();
    for (const f of fs.readdirSync(dir).filter((x) => x.endsWith('.eml'))) {
      const m = await simpleParser(fs.readFileSync(path.join(dir, f)));
      const to = Array.isArray(m.to) ? m.to.map((x) => x.text).join(',') : (m.to?.text ?? '');
      for (const r of recipients) if (to.toLowerCase() === r.toLowerCase()) counts.set(r, (counts.get(r) ?? 0) + 1);
    }
    expect(recipients.map((r) => counts.get(r) ?? 0)).toEqual([1, 1]);
  });
});
