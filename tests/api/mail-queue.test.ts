/**
 * Mail goes through the durable queue (server/lib/mail/mail-queue.ts): every defect of the
 * fire-and-forget sends, reproduced on the real app, PostgreSQL, pg-boss and the SMTP fake.
 * "Mail down" is a real relay connection refused: the app's mailer pointed at a closed port.
 */
import net from 'node:net';
import { Writable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';
import { latestMailTo, linkIn } from '../support/mail';
import { seedReportScenario } from '../support/report-fixtures';
import { createSmtpMailer, type Mailer } from '@server/lib/mail/mailer';
import { MailQueue } from '@server/lib/mail/mail-queue';
import { createLogger } from '@server/lib/logger';

let t: TestApp;
let a: TestShop;
let b: TestShop;
let realSend: Mailer['send'];
let deadPort = 0;

/** A port nothing listens on: a connection to it is refused at once. */
async function closedPort(): Promise<number> {
  const srv = net.createServer();
  await new Promise<void>((r) => srv.listen(0, '127.0.0.1', () => r()));
  const port = (srv.address() as net.AddressInfo).port;
  await new Promise<void>((r) => srv.close(() => r()));
  return port;
}

const mailDown = () => {
  t.deps.mailer.send = createSmtpMailer(`smtp://127.0.0.1:${deadPort}`, 'Pullbook <no-reply@pullbook.test>').send;
};
const mailUp = () => {
  t.deps.mailer.send = realSend;
};
const sql = <T = Record<string, unknown>>(q: string, p: unknown[] = []) => t.deps.orm.em.fork().getConnection().execute(q, p) as Promise<T[]>;

async function waitFor<T>(fn: () => Promise<T>, ok: (v: T) => boolean, what: string, ms = 20_000): Promise<T> {
  const t0 = Date.now();
  for (;;) {
    const v = await fn();
    if (ok(v)) return v;
    if (Date.now() - t0 > ms) throw new Error(`timed out waiting for ${what}: ${JSON.stringify(v)}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

beforeAll(async () => {
  t = await createTestApp();
  a = await t.createShop('Mailq A');
  b = await t.createShop('Mailq B');
  realSend = t.deps.mailer.send;
  deadPort = await closedPort();
});
afterAll(() => t.close());

describe('invitations', () => {
  it('made while mail is down: audited, queued, re-sendable, and sent once the relay is back', async () => {
    const owner = await t.signIn(a.users.owner);
    mailDown();
    let userId: string;
    try {
      const res = await owner.post('/api/users').send({ email: 'late.tuner@mailq-a.test', name: 'Late Tuner', role: 'tuner' });
      expect(res.status).toBe(201);
      userId = res.body.id;
      const audit = await owner.get('/api/audit');
      expect(audit.body.items.some((e: { action: string; entityId: string }) => e.action === 'user.invite' && e.entityId === userId)).toBe(true);
      // The first try fails (connection refused) and the message stays queued with an error for staff.
      const [row] = await waitFor(
        () => sql<{ status: string; attempts: number; last_error: string | null }>(`select status, attempts, last_error from mail_message where recipient = 'late.tuner@mailq-a.test'`),
        (r) => r.length === 1 && r[0].attempts >= 1 && r[0].status === 'queued',
        'a failed first try',
      );
      expect(row.last_error).toMatch(/tried again/);
      const log = await owner.get('/api/outbox/log');
      const entry = log.body.items.find((m: { to: string }) => m.to === 'late.tuner@mailq-a.test');
      expect(entry).toMatchObject({ kind: 'invite', status: 'queued' });
      // Staff never see the relay's address or port.
      expect(JSON.stringify(log.body)).not.toContain(String(deadPort));
      expect(JSON.stringify(log.body)).not.toContain('127.0.0.1');
      expect((await owner.post(`/api/users/${userId}/resend-invite`)).status).toBe(200);
    } finally {
      mailUp();
    }
    // Back up: the newer invitation arrives, exactly once, and its link works.
    const mail = await latestMailTo('late.tuner@mailq-a.test', 20_000);
    const token = linkIn(mail.text, '/invite/');
    expect((await t.request.get(`/api/auth/token/${token}`)).status).toBe(200);
    const rows = await waitFor(
      () => sql<{ status: string }>(`select status from mail_message where recipient = 'late.tuner@mailq-a.test' order by created_at`),
      (r) => r.some((x) => x.status === 'sent'),
      'the invitation sent',
    );
    expect(rows.map((r) => r.status)).toEqual(['failed', 'sent']);
  });

  it('inviting an address of another shop answers exactly as for a new address', async () => {
    const owner = await t.signIn(a.users.owner);
    const fresh = await owner.post('/api/users').send({ email: 'brand.new@mailq-a.test', name: 'Brand New', role: 'desk' });
    const taken = await owner.post('/api/users').send({ email: b.users.desk.email, name: 'Someone', role: 'desk' });
    expect(taken.status).toBe(fresh.status);
    expect(Object.keys(taken.body).sort()).toEqual(Object.keys(fresh.body).sort());
    expect(taken.body).toMatchObject({ email: b.users.desk.email, invitePending: true, role: 'desk', disabled: false });
    // The other shop's user is untouched and no second account exists.
    const [{ n }] = await sql<{ n: string }>(`select count(*) as n from app_user where lower(email) = lower(?)`, [b.users.desk.email]);
    expect(Number(n)).toBe(1);
    // The same address within one's own shop is still refused (the owner sees their own users).
    expect((await owner.post('/api/users').send({ email: a.users.desk.email, name: 'Dup', role: 'desk' })).status).toBe(409);

    // A reload shows both invitations alike; a second invitation of either is refused alike.
    const listed = (await owner.get('/api/users')).body.items as { id: string; email: string; invitePending: boolean }[];
    const shape = (email: string) => listed.filter((u) => u.email === email).map((u) => ({ invitePending: u.invitePending, keys: Object.keys(u).sort() }));
    expect(shape(b.users.desk.email)).toEqual(shape('brand.new@mailq-a.test'));
    expect(shape(b.users.desk.email)).toHaveLength(1);
    const again = (email: string) => owner.post('/api/users').send({ email, name: 'Again', role: 'desk' });
    expect([(await again('brand.new@mailq-a.test')).status, (await again(b.users.desk.email)).status]).toEqual([409, 409]);
    // Resending and renaming answer alike too.
    const resendFresh = await owner.post(`/api/users/${fresh.body.id}/resend-invite`);
    const resendTaken = await owner.post(`/api/users/${taken.body.id}/resend-invite`);
    expect([resendTaken.status, resendTaken.body]).toEqual([resendFresh.status, resendFresh.body]);
    const renamed = await owner.patch(`/api/users/${taken.body.id}`).send({ name: 'Someone Else' });
    expect(renamed.status).toBe(200);
    expect(renamed.body).toMatchObject({ id: taken.body.id, name: 'Someone Else', invitePending: true });

    // A customer invited with an address of another shop shows as having portal access, as any.
    const customer = (await owner.post('/api/customers').send({ name: 'Elsewhere Rider', email: b.users.customer.email })).body;
    expect((await owner.post('/api/users').send({ email: b.users.customer.email, name: 'Elsewhere Rider', role: 'customer', customerId: customer.id })).status).toBe(201);
    expect((await owner.get(`/api/customers/${customer.id}`)).body.hasPortalAccess).toBe(true);

    // Once the address no longer signs in anywhere, a resend sends the real invitation.
    await sql(`delete from app_user where lower(email) = lower(?)`, [b.users.desk.email]);
    expect((await owner.post(`/api/users/${taken.body.id}/resend-invite`)).status).toBe(resendFresh.status);
    const mail = await latestMailTo(b.users.desk.email, 20_000, (m) => m.text.includes('/invite/'));
    expect((await t.request.get(`/api/auth/token/${linkIn(mail.text, '/invite/')}`)).status).toBe(200);
    const after = (await owner.get('/api/users')).body.items as { id: string; email: string }[];
    expect(after.filter((u) => u.email === b.users.desk.email).map((u) => u.id)).toEqual([taken.body.id]);
  });
});

describe('password reset requests', () => {
  it('answer the same, in the same time, for known and unknown accounts, even with mail down', async () => {
    mailDown();
    try {
      const times: Record<'known' | 'unknown', number[]> = { known: [], unknown: [] };
      const bodies = new Set<string>();
      for (let i = 0; i < 3; i++) {
        for (const [kind, email] of [['known', a.users.desk.email], ['unknown', `ghost${i}@nowhere.test`]] as const) {
          const t0 = performance.now();
          const res = await t.request.post('/api/auth/forgot').send({ email });
          times[kind].push(performance.now() - t0);
          expect(res.status).toBe(202);
          bodies.add(JSON.stringify(res.body));
        }
      }
      expect(bodies.size).toBe(1);
      const median = (xs: number[]) => [...xs].sort((x, y) => x - y)[1];
      // Both are padded to the same floor (RESET_ANSWER_MS = 300); the old code took ~10× longer for a known account.
      expect(Math.min(...times.known, ...times.unknown)).toBeGreaterThanOrEqual(295);
      expect(Math.abs(median(times.known) - median(times.unknown))).toBeLessThan(100);
    } finally {
      mailUp();
    }
    // The known account's link still arrives once mail is back.
    const mail = await latestMailTo(a.users.desk.email, 30_000);
    expect(mail.text).toContain('/reset-password/');
  });
});

describe('report e-mails', () => {
  let reportId: string;
  beforeAll(async () => {
    const long = 'Q'.repeat(100);
    await sql(`update bike set make = ?, model = ? where id = ?`, [long, `${'Z'.repeat(99)}X`, a.bike.id]);
    const scenario = await seedReportScenario(t, a);
    const tuner = await t.signIn(a.users.tuner);
    const res = await tuner.post('/api/reports').send({ comparisonId: scenario.comparisonId });
    expect(res.status).toBe(201);
    reportId = res.body.id;
  });

  it('a 100-character make and model: delivered, 201, subject within limits', async () => {
    const desk = await t.signIn(a.users.desk);
    const res = await desk.post(`/api/reports/${reportId}/send`).send({ to: 'long.bike@mailq.test', message: 'Your report.' });
    expect(res.status).toBe(201);
    expect(res.body.status).toBe('sent');
    expect(res.body.subject.length).toBeLessThanOrEqual(150);
    const mail = await latestMailTo('long.bike@mailq.test');
    expect(mail.subject).toBe(res.body.subject);
  });

  it('with the relay away: never 500, the delivery is queued and goes once the relay is back', async () => {
    const desk = await t.signIn(a.users.desk);
    mailDown();
    let res;
    try {
      res = await desk.post(`/api/reports/${reportId}/send`).send({ to: 'patient@mailq.test', message: 'Later.' });
    } finally {
      mailUp();
    }
    expect(res.status).toBe(201);
    expect(res.body.status).toBe('queued');
    expect(JSON.stringify(res.body)).not.toContain(String(deadPort));
    await latestMailTo('patient@mailq.test', 30_000);
    const log = await waitFor(
      () => desk.get(`/api/reports/${reportId}/deliveries`),
      (r) => r.body.items.find((d: { to: string }) => d.to === 'patient@mailq.test')?.status === 'sent',
      'the delivery marked sent',
    );
    expect(log.body.items.filter((d: { to: string }) => d.to === 'patient@mailq.test')).toHaveLength(1);
  });

  it('refused for good: MAIL_FAILED, logged failed, and no share link left behind', async () => {
    const desk = await t.signIn(a.users.desk);
    const before = (await desk.get(`/api/reports/${reportId}/share`)).body.items.length;
    t.deps.mailer.send = async () => {
      throw Object.assign(new Error('Can\'t send mail - all recipients were rejected: 550 5.1.1 <gone@mailq.test>: no such user'), { responseCode: 550, code: 'EENVELOPE' });
    };
    try {
      const res = await desk.post(`/api/reports/${reportId}/send`).send({ to: 'gone@mailq.test', message: 'Hi' });
      expect(res.status).toBe(502);
      expect(res.body.error.code).toBe('MAIL_FAILED');
    } finally {
      mailUp();
    }
    expect((await desk.get(`/api/reports/${reportId}/share`)).body.items.length).toBe(before);
    const owner = await t.signIn(a.users.owner);
    const entry = (await owner.get('/api/outbox/log')).body.items.find((m: { to: string }) => m.to === 'gone@mailq.test');
    expect(entry).toMatchObject({ kind: 'report', status: 'failed', retryable: false });
  });
});

describe('send log', () => {
  it('lets the owner queue a failed message again; other shops see and retry nothing of it', async () => {
    const owner = await t.signIn(a.users.owner);
    const res = await owner.post('/api/users').send({ email: 'bounce@mailq-a.test', name: 'Bounce', role: 'desk' });
    const [{ id }] = await waitFor(() => sql<{ id: string }>(`select id from mail_message where recipient = 'bounce@mailq-a.test'`), (r) => r.length === 1, 'the queued invitation');
    await waitFor(() => sql<{ status: string }>(`select status from mail_message where id = ?`, [id]), (r) => r[0].status === 'sent', 'the first send');
    await sql(`update mail_message set status = 'failed', last_error = 'test', body = '{"text":"again"}'::jsonb where id = ?`, [id]);
    expect(res.status).toBe(201);
    const otherOwner = await t.signIn(b.users.owner);
    expect((await otherOwner.get('/api/outbox/log')).body.items.some((m: { id: string }) => m.id === id)).toBe(false);
    expect((await otherOwner.post(`/api/outbox/log/${id}/retry`)).status).toBe(404);
    expect((await owner.post(`/api/outbox/log/${id}/retry`)).status).toBe(200);
    await waitFor(() => sql<{ status: string; attempts: number }>(`select status, attempts from mail_message where id = ?`, [id]), (r) => r[0].status === 'sent' && r[0].attempts === 2, 'the retried send');
  });
});

describe('exactly once', () => {
  it('two mail workers on one database send each of 20 queued messages once', async () => {
    const sent: string[] = [];
    const quiet = createLogger({ destination: new Writable({ write: (_c, _e, done) => done() }) });
    const make = () =>
      new MailQueue({
        orm: t.deps.orm,
        storage: t.deps.storage,
        mailer: { send: async (m) => (sent.push(m.to), { messageId: `<${sent.length}@test>` }) },
        connectionString: t.deps.config.DATABASE_URL,
        logger: quiet,
        relayNames: [],
        pollingIntervalSeconds: 0.5,
        sweepSeconds: 1,
        sweepGraceSeconds: 0,
      });
    // The app's own worker stops first, so only the two test workers send.
    await t.deps.mail.stop();
    const q1 = make();
    const q2 = make();
    try {
      for (let i = 0; i < 20; i++) {
        await sql(`insert into mail_message (shop_id, message_key, kind, recipient, subject, body) values (?, ?, 'notice', ?, 'Hello', '{"text":"hi"}'::jsonb)`, [a.shop.id, `once-${i}`, `once${i}@mailq.test`]);
      }
      await Promise.all([q1.start(), q2.start()]);
      // Both sweeps find the overdue rows; both dispatch; each row is still claimed once.
      const ours = () => sent.filter((to) => to.startsWith('once'));
      await waitFor(async () => ours().length, (n) => n >= 20, 'twenty sends');
      await new Promise((r) => setTimeout(r, 2000));
      expect(ours()).toHaveLength(20);
      expect(new Set(ours()).size).toBe(20);
    } finally {
      await q1.stop();
      await q2.stop();
    }
  });
});
