/**
 * Sign-in throttling instead of lockout (lib/login-throttle.ts), on the real app behind a trusted
 * proxy (TRUST_PROXY=loopback) so each request can come from its own client address.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, TEST_PASSWORD, type TestApp, type TestShop } from '../support/test-app';

let t: TestApp;
let s: TestShop;

beforeAll(async () => {
  t = await createTestApp({ env: { TRUST_PROXY: 'loopback' }, workers: false });
  s = await t.createShop('Throttle Shop');
});
afterAll(() => t.close());

const login = (app: TestApp, email: string, password: string, ip: string) => app.request.post('/api/auth/login').set('X-Forwarded-For', ip).send({ email, password });

describe('sign-in throttling', () => {
  it('never counts successful sign-ins against an address (a shop behind one NAT)', async () => {
    const nat = '203.0.113.10';
    const statuses: number[] = [];
    // More sign-ins than the old per-address budget of 50 attempts in 15 minutes.
    for (let i = 0; i < 52; i++) statuses.push((await login(t, Object.values(s.users)[i % 4].email, TEST_PASSWORD, nat)).status);
    expect(statuses.filter((x) => x !== 200)).toEqual([]);
  });

  it('lets the real user in with the right password while an attacker hammers from another address', async () => {
    const home = '203.0.113.20';
    const attacker = '198.51.100.66';
    // The user has signed in from home before.
    expect((await login(t, s.users.desk.email, TEST_PASSWORD, home)).status).toBe(200);
    const seen: number[] = [];
    for (let i = 0; i < 30; i++) seen.push((await login(t, s.users.desk.email, `guess-${i}`, attacker)).status);
    expect(seen.slice(0, 5)).toEqual([401, 401, 401, 401, 401]);
    expect(seen.at(-1)).toBe(429);
    // Slowed, not locked: the attacker's answer names a wait.
    const blocked = await login(t, s.users.desk.email, 'another-guess', attacker);
    expect(blocked.status).toBe(429);
    expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(0);
    // The attacker's right guess is refused while throttled: the password is not even checked.
    expect((await login(t, s.users.desk.email, TEST_PASSWORD, attacker)).status).toBe(429);
    // The real user, from home: straight in.
    expect((await login(t, s.users.desk.email, TEST_PASSWORD, home)).status).toBe(200);
  });

  it('slows guesses spread over many addresses with the per-account cap, at most a minute at a time', async () => {
    const statuses: number[] = [];
    let retryAfter = 0;
    for (let i = 0; i < 14; i++) {
      const res = await login(t, s.users.tuner.email, `spread-${i}`, `192.0.2.${i + 1}`);
      statuses.push(res.status);
      if (res.status === 429) retryAfter = Number(res.headers['retry-after']);
    }
    expect(statuses.slice(0, 10).every((x) => x === 401)).toBe(true);
    expect(statuses).toContain(429);
    expect(retryAfter).toBeGreaterThan(0);
    expect(retryAfter).toBeLessThanOrEqual(60);
  });

  it('counts across app instances sharing the database', async () => {
    const other = await createTestApp({ databaseUrl: t.deps.config.DATABASE_URL, env: { TRUST_PROXY: 'loopback' }, workers: false });
    try {
      const ip = '198.51.100.99';
      for (let i = 0; i < 5; i++) expect((await login(i % 2 ? t : other, s.users.customer.email, `x-${i}`, ip)).status).toBe(401);
      // The sixth try is refused on either instance.
      expect((await login(other, s.users.customer.email, 'x-5', ip)).status).toBe(429);
      expect((await login(t, s.users.customer.email, 'x-6', ip)).status).toBe(429);
    } finally {
      await other.close();
    }
  });
});
