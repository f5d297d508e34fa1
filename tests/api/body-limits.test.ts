import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, TEST_PASSWORD, type TestApp, type TestShop } from '../support/test-app';

let t: TestApp;
let a: TestShop;

beforeAll(async () => {
  t = await createTestApp();
  a = await t.createShop('Body Limit Shop');
});
afterAll(() => t.close());

/** About `bytes` of JSON: an array of small nested arrays. */
function nestedArrays(bytes: number): string {
  const item = '[[1,[2,[3]]],[[4]]]';
  return `[${Array.from({ length: Math.ceil(bytes / (item.length + 1)) }, () => item).join(',')}]`;
}

describe('JSON body limits by route', () => {
  it('refuses a 2 MB body to the sign-in route with 413 BODY_TOO_LARGE', async () => {
    // 2 MB (decimal): just under the 2 MiB cap of the other API routes, so only the sign-in cap refuses it.
    const body = nestedArrays(2_000_000);
    expect(body.length).toBeGreaterThanOrEqual(2_000_000);
    expect(body.length).toBeLessThan(2 * 1024 * 1024);
    const res = await t.request.post('/api/auth/login').set('Content-Type', 'application/json').send(body);
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('BODY_TOO_LARGE');
  });

  it('still signs in with a normal body', async () => {
    const res = await t.request.post('/api/auth/login').send({ email: a.users.owner.email, password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body.user.email).toBe(a.users.owner.email);
  });

  it('keeps the larger limit elsewhere: a 100 kB body to another API route is parsed', async () => {
    const agent = await t.signIn(a.users.owner);
    const res = await agent.post('/api/customers').set('Content-Type', 'application/json').send(JSON.stringify({ name: 'Big Note Rider', notes: 'x'.repeat(100_000) }));
    // Parsed and then checked by the route's schema (notes allow 5000 characters), not refused unread.
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('VALIDATION_FAILED');
    // The same size is refused on the sign-in route.
    const auth = await t.request.post('/api/auth/login').set('Content-Type', 'application/json').send(JSON.stringify({ email: 'a@b.test', password: 'x'.repeat(100_000) }));
    expect(auth.status).toBe(413);
  });
});
