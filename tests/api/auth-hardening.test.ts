/**
 * Hardening of passwords and sessions: the strength policy on every path that sets a password,
 * other sessions ending on a password change or reset, a disabled user's links dying, and the
 * change form's limit on wrong current passwords.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, TEST_PASSWORD, type TestApp } from '../support/test-app';
import { latestMailTo, linkIn } from '../support/mail';
import { seedReportScenario } from '../support/report-fixtures';
import { CHANGE_PASSWORD_LIMIT } from '@server/modules/auth/auth.service';

let t: TestApp;

beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const STRONG = 'gravel-lantern-orchid-42';

async function resetTokenFor(email: string) {
  await t.request.post('/api/auth/forgot').send({ email });
  return linkIn((await latestMailTo(email)).text, '/reset-password/');
}

describe('password strength', () => {
  it('refuses a common password on the change form with a field message on newPassword', async () => {
    const s = await t.createShop('Weak Change Shop');
    const agent = await t.signIn(s.users.desk);
    // "password1234" is on the common-password list shipped with @zxcvbn-ts/language-common (NIST SP 800-63B §5.1.1.2).
    const res = await agent.post('/api/auth/password').send({ currentPassword: TEST_PASSWORD, newPassword: 'password1234' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('VALIDATION_FAILED');
    expect(res.body.error.details.fields[0].path).toBe('newPassword');
    expect(res.body.error.details.fields[0].message).toMatch(/commonly used/);
    // The old password still works.
    expect((await t.request.post('/api/auth/login').send({ email: s.users.desk.email, password: TEST_PASSWORD })).status).toBe(200);
  });

  it('refuses a password built from the user’s own e-mail when set from a reset link, and keeps the link usable', async () => {
    const s = await t.createShop('Weak Reset Shop');
    const token = await resetTokenFor(s.users.tuner.email);
    const local = s.users.tuner.email.split('@')[0]!;
    const weak = await t.request.post('/api/auth/set-password').send({ token, password: `${local}2026` });
    expect(weak.status).toBe(400);
    expect(weak.body.error.code).toBe('VALIDATION_FAILED');
    expect(weak.body.error.details.fields[0].path).toBe('password');
    const keyboard = await t.request.post('/api/auth/set-password').send({ token, password: 'qwertyuiop' });
    expect(keyboard.status).toBe(400);
    expect((await t.request.post('/api/auth/set-password').send({ token, password: STRONG })).status).toBe(200);
  });
});

describe('sessions after a password change or reset', () => {
  it('a change signs out the user’s other sessions and keeps the current one', async () => {
    const s = await t.createShop('Change Sessions Shop');
    const here = await t.signIn(s.users.desk);
    const elsewhere = await t.signIn(s.users.desk);
    const colleague = await t.signIn(s.users.tuner);
    expect((await elsewhere.get('/api/auth/me')).status).toBe(200);
    expect((await here.post('/api/auth/password').send({ currentPassword: TEST_PASSWORD, newPassword: STRONG })).status).toBe(200);
    expect((await here.get('/api/auth/me')).status).toBe(200);
    expect((await elsewhere.get('/api/auth/me')).status).toBe(401);
    expect((await colleague.get('/api/auth/me')).status).toBe(200);
  });

  it('a reset signs out every session the user had', async () => {
    const s = await t.createShop('Reset Sessions Shop');
    const old = await t.signIn(s.users.tuner);
    const token = await resetTokenFor(s.users.tuner.email);
    expect((await t.request.post('/api/auth/set-password').send({ token, password: STRONG })).status).toBe(200);
    expect((await old.get('/api/auth/me')).status).toBe(401);
  });
});

describe('disabling a user', () => {
  it('kills their unused reset link for good and stops their share links', async () => {
    const s = await t.createShop('Disable Shop');
    await seedReportScenario(t, s);
    const owner = await t.signIn(s.users.owner);
    const desk = await t.signIn(s.users.desk);
    const comparisonId = (await owner.get('/api/comparisons')).body.items[0].id as string;
    const report = await desk.post('/api/reports').send({ comparisonId });
    expect(report.status).toBe(201);
    const share = await desk.post(`/api/reports/${report.body.id}/share`).send({});
    expect(share.status).toBe(201);
    const shareToken = new URL(share.body.url).pathname.split('/').pop()!;
    expect((await t.request.get(`/api/share/${shareToken}`)).status).toBe(200);
    const resetToken = await resetTokenFor(s.users.desk.email);

    expect((await owner.patch(`/api/users/${s.users.desk.id}`).send({ disabled: true })).status).toBe(200);
    expect((await t.request.get(`/api/share/${shareToken}`)).status).not.toBe(200);
    expect((await owner.patch(`/api/users/${s.users.desk.id}`).send({ disabled: false })).status).toBe(200);
    // Enabling the user again brings neither back.
    expect((await t.request.get(`/api/share/${shareToken}`)).status).not.toBe(200);
    const set = await t.request.post('/api/auth/set-password').send({ token: resetToken, password: STRONG });
    expect(set.status).toBe(400);
    expect(set.body.error.code).toBe('TOKEN_INVALID');
  });
});

describe('wrong current password on the change form', () => {
  it(`answers 429 RATE_LIMITED with Retry-After after ${CHANGE_PASSWORD_LIMIT.limit} wrong tries`, async () => {
    const s = await t.createShop('Guess Shop');
    const agent = await t.signIn(s.users.desk);
    for (let i = 0; i < CHANGE_PASSWORD_LIMIT.limit; i++) {
      const res = await agent.post('/api/auth/password').send({ currentPassword: `wrong-guess-${i}`, newPassword: STRONG });
      expect(res.status).toBe(400);
    }
    const limited = await agent.post('/api/auth/password').send({ currentPassword: TEST_PASSWORD, newPassword: STRONG });
    expect(limited.status).toBe(429);
    expect(limited.body.error.code).toBe('RATE_LIMITED');
    expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0);
    expect(Number(limited.headers['retry-after'])).toBeLessThanOrEqual(15 * 60);
  });
});
