import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import pg from 'pg';
import { createTestApp, TEST_PASSWORD, type TestApp, type TestShop } from '../support/test-app';
import { latestMailTo, linkIn } from '../support/mail';

let t: TestApp;
let a: TestShop;

beforeAll(async () => {
  t = await createTestApp();
  a = await t.createShop('Auth Shop');
});
afterAll(() => t.close());

describe('sign-in', () => {
  it('signs in with the right password and reports the role', async () => {
    const agent = t.request;
    const res = await agent.post('/api/auth/login').send({ email: a.users.tuner.email, password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    const cookie = res.headers['set-cookie']?.[0] ?? '';
    expect(cookie).toMatch(/pullbook\.sid=/);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    const me = await t.request.get('/api/auth/me').set('Cookie', cookie.split(';')[0]);
    expect(me.status).toBe(200);
    expect(me.body.role).toBe('tuner');
    expect(me.body.email).toBe(a.users.tuner.email);
  });

  it('answers 401 to a wrong password and to an unknown account', async () => {
    expect((await t.request.post('/api/auth/login').send({ email: a.users.desk.email, password: 'wrong-password' })).status).toBe(401);
    expect((await t.request.post('/api/auth/login').send({ email: 'nobody@nowhere.test', password: 'whatever-pass' })).status).toBe(401);
  });

  it('answers 401 on /me when signed out and after sign-out', async () => {
    expect((await t.request.get('/api/auth/me')).status).toBe(401);
    const agent = await t.signIn(a.users.desk);
    expect((await agent.get('/api/auth/me')).status).toBe(200);
    expect((await agent.post('/api/auth/logout')).status).toBe(200);
    expect((await agent.get('/api/auth/me')).status).toBe(401);
  });

  it('gives a new session id at sign-in (no session fixation)', async () => {
    const agent = t.request;
    const first = await agent.post('/api/auth/login').send({ email: a.users.owner.email, password: TEST_PASSWORD });
    const second = await agent.post('/api/auth/login').send({ email: a.users.owner.email, password: TEST_PASSWORD });
    const sid = (r: typeof first) => (r.headers['set-cookie']?.[0] ?? '').split(';')[0];
    expect(sid(first)).not.toBe(sid(second));
  });

  it('stores sessions in PostgreSQL', async () => {
    await t.signIn(a.users.tuner);
    const rows = (await t.deps.orm.em.fork().getConnection().execute(`select count(*)::int as n from http_session`)) as { n: number }[];
    expect(rows[0].n).toBeGreaterThan(0);
  });

  it('reads the session and its signed-in user with one statement per request', async () => {
    const tuner = await t.signIn(a.users.tuner);
    // The session store's pool is a pg.Pool; the ORM's connections are not.
    const spy = vi.spyOn(pg.Pool.prototype, 'query');
    try {
      const me = await tuner.get('/api/auth/me');
      expect(me.status).toBe(200);
      expect(me.body.id).toBe(a.users.tuner.id);
      expect(spy.mock.calls.map((c) => (c[0] as { name?: string }).name ?? String(c[0]))).toEqual(['pullbook-session-with-user']);
    } finally {
      spy.mockRestore();
    }
  });

  it('refuses a disabled user', async () => {
    const s = await t.createShop('Disabled Shop');
    const owner = await t.signIn(s.users.owner);
    const tuner = await t.signIn(s.users.tuner);
    expect((await owner.patch(`/api/users/${s.users.tuner.id}`).send({ disabled: true })).status).toBe(200);
    expect((await tuner.get('/api/auth/me')).status).toBe(401);
    expect((await t.request.post('/api/auth/login').send({ email: s.users.tuner.email, password: TEST_PASSWORD })).status).toBe(401);
  });

  it('rate-limits sign-in attempts per account with 429 and Retry-After', async () => {
    const s = await t.createShop('Limit Shop');
    let last = 0;
    let retryAfter: string | undefined;
    for (let i = 0; i < 12; i++) {
      const res = await t.request.post('/api/auth/login').send({ email: s.users.desk.email, password: 'not-the-password' });
      last = res.status;
      retryAfter = res.headers['retry-after'];
    }
    expect(last).toBe(429);
    expect(Number(retryAfter)).toBeGreaterThan(0);
    // The right password is refused too while the account is locked out.
    expect((await t.request.post('/api/auth/login').send({ email: s.users.desk.email, password: TEST_PASSWORD })).status).toBe(429);
  });
});

describe('passwords', () => {
  it('changes the password after checking the current one', async () => {
    const s = await t.createShop('Password Shop');
    const agent = await t.signIn(s.users.desk);
    const wrong = await agent.post('/api/auth/password').send({ currentPassword: 'nope-nope-nope', newPassword: 'a-brand-new-secret' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.code).toBe('PASSWORD_WRONG');
    expect((await agent.post('/api/auth/password').send({ currentPassword: TEST_PASSWORD, newPassword: 'a-brand-new-secret' })).status).toBe(200);
    expect((await t.request.post('/api/auth/login').send({ email: s.users.desk.email, password: 'a-brand-new-secret' })).status).toBe(200);
  });

  it('resets a password through an e-mailed, single-use link', async () => {
    const s = await t.createShop('Reset Shop');
    const res = await t.request.post('/api/auth/forgot').send({ email: s.users.tuner.email });
    expect(res.status).toBe(202);
    const mail = await latestMailTo(s.users.tuner.email);
    const token = linkIn(mail.text, '/reset-password/');
    expect((await t.request.get(`/api/auth/token/${token}`)).body.purpose).toBe('reset');
    const set = await t.request.post('/api/auth/set-password').send({ token, password: 'reset-and-ready-1' });
    expect(set.status).toBe(200);
    expect((await t.request.post('/api/auth/login').send({ email: s.users.tuner.email, password: 'reset-and-ready-1' })).status).toBe(200);
    const again = await t.request.post('/api/auth/set-password').send({ token, password: 'second-use-attempt' });
    expect(again.status).toBe(400);
    expect(again.body.error.code).toBe('TOKEN_INVALID');
  });

  it('answers the same for an unknown address (no account discovery)', async () => {
    const res = await t.request.post('/api/auth/forgot').send({ email: 'ghost@nowhere.test' });
    expect(res.status).toBe(202);
  });

  it('refuses an expired reset token', async () => {
    const s = await t.createShop('Expiry Shop');
    await t.request.post('/api/auth/forgot').send({ email: s.users.desk.email });
    const token = linkIn((await latestMailTo(s.users.desk.email)).text, '/reset-password/');
    await t.deps.orm.em.fork().getConnection().execute(`update auth_token set expires_at = now() - interval '1 minute'`);
    expect((await t.request.post('/api/auth/set-password').send({ token, password: 'too-late-for-this' })).status).toBe(400);
  });
});

describe('invitations', () => {
  it('lets the owner invite a user who then sets a password and signs in', async () => {
    const s = await t.createShop('Invite Shop');
    const owner = await t.signIn(s.users.owner);
    const res = await owner.post('/api/users').send({ email: 'new.tuner@invite-shop.test', name: 'New Tuner', role: 'tuner' });
    expect(res.status).toBe(201);
    expect(res.body.invitePending).toBe(true);
    const token = linkIn((await latestMailTo('new.tuner@invite-shop.test')).text, '/invite/');
    const set = await t.request.post('/api/auth/set-password').send({ token, password: 'my-first-password' });
    expect(set.status).toBe(200);
    expect(set.body.user.role).toBe('tuner');
    const list = await owner.get('/api/users');
    expect(list.body.items.find((u: { email: string }) => u.email === 'new.tuner@invite-shop.test').invitePending).toBe(false);
  });

  it('lets the owner change a role, and the change applies at once', async () => {
    const s = await t.createShop('Role Shop');
    const owner = await t.signIn(s.users.owner);
    const desk = await t.signIn(s.users.desk);
    expect((await desk.get('/api/users')).status).toBe(403);
    expect((await owner.patch(`/api/users/${s.users.desk.id}`).send({ role: 'owner' })).status).toBe(200);
    expect((await desk.get('/api/users')).status).toBe(200);
    const audit = await owner.get('/api/audit');
    const entry = audit.body.items.find((e: { action: string; entityId: string }) => e.action === 'user.update' && e.entityId === s.users.desk.id);
    expect(entry.details).toEqual({ before: expect.objectContaining({ role: 'desk' }), after: expect.objectContaining({ role: 'owner' }) });
    const onlyUsers = await owner.get('/api/audit').query({ kinds: 'user' });
    expect(onlyUsers.body.items.length).toBeGreaterThan(0);
    expect(onlyUsers.body.items.every((e: { action: string }) => e.action.startsWith('user.'))).toBe(true);
    expect((await owner.get('/api/audit').query({ kinds: 'customer' })).body.items.some((e: { action: string }) => e.action.startsWith('user.'))).toBe(false);
  });

  it('stops an owner from demoting themselves', async () => {
    const s = await t.createShop('Self Shop');
    const owner = await t.signIn(s.users.owner);
    const res = await owner.patch(`/api/users/${s.users.owner.id}`).send({ role: 'desk' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('CANNOT_DEMOTE_SELF');
  });
});

describe('cross-site requests', () => {
  it('refuses a state change from another origin with 403', async () => {
    const agent = await t.signIn(a.users.desk);
    const res = await agent.post('/api/customers').set('Origin', 'https://evil.example').send({ name: 'X' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('CROSS_ORIGIN');
    const fetchSite = await agent.post('/api/customers').set('Sec-Fetch-Site', 'cross-site').send({ name: 'X' });
    expect(fetchSite.status).toBe(403);
  });

  it('accepts the same origin and clients that send a matching Origin', async () => {
    const agent = await t.signIn(a.users.desk);
    const res = await agent.post('/api/customers').set('Origin', 'http://127.0.0.1:3999').set('Sec-Fetch-Site', 'same-origin').send({ name: 'Same Origin Rider' });
    expect(res.status).toBe(201);
  });
});
