/**
 * Every list route answers one page shape, `{ items, total, page, pageSize, nextCursor? }`
 * (src/shared/schemas/common.ts `Page<T>`), so the client never guesses how a list comes back.
 * Each registered GET route is called as the owner with the query it needs; any answer that is a
 * bare JSON array fails, and every answer with `items` must carry the rest of the shape.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';

let t: TestApp;
let s: TestShop;

beforeAll(async () => {
  t = await createTestApp();
  s = await t.createShop('Page Shape Shop');
});
afterAll(() => t.close());

describe('list routes', () => {
  it('answer Page<T>, never a bare array', async () => {
    const owner = await t.signIn(s.users.owner);
    const bikeScoped = { bikeId: s.bike.id };
    const gets = t.routes.filter((r) => r.method === 'get' && !r.path.includes(':'));
    expect(gets.length).toBeGreaterThan(10);
    const checked: string[] = [];
    for (const r of gets) {
      const res = await owner.get(r.path).query(bikeScoped);
      if (res.status !== 200 || !res.type.includes('json')) continue;
      expect(Array.isArray(res.body), `${r.path} answers a bare array`).toBe(false);
      if (res.body && typeof res.body === 'object' && 'items' in res.body) {
        expect(res.body, r.path).toMatchObject({ items: expect.any(Array), total: expect.any(Number), page: expect.any(Number), pageSize: expect.any(Number) });
        checked.push(r.path);
      }
    }
    // The everyday lists are among those checked.
    for (const p of ['/api/runs/', '/api/bikes/', '/api/customers/', '/api/comparisons/', '/api/reports/', '/api/sessions/', '/api/stages/', '/api/users/', '/api/audit/']) expect(checked).toContain(p);
  });
});
