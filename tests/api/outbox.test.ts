import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';
import { latestMailTo } from '../support/mail';

let t: TestApp;
let a: TestShop;
let b: TestShop;

beforeAll(async () => {
  t = await createTestApp();
  a = await t.createShop('Outbox A');
  b = await t.createShop('Outbox B');
});
afterAll(() => t.close());

describe('outbox of captured mail', () => {
  it('shows each shop only the mail sent for it (reset links never cross shops)', async () => {
    await t.request.post('/api/auth/forgot').send({ email: a.users.tuner.email });
    await latestMailTo(a.users.tuner.email);
    const ownerA = await t.signIn(a.users.owner);
    const ownerB = await t.signIn(b.users.owner);

    const listA = await ownerA.get('/api/outbox');
    expect(listA.status).toBe(200);
    const mine = listA.body.items.find((m: { to: string }) => m.to.includes(a.users.tuner.email));
    expect(mine).toBeTruthy();
    expect((await ownerA.get(`/api/outbox/${mine.id}`)).body.text).toContain('/reset-password/');

    const listB = await ownerB.get('/api/outbox');
    expect(listB.body.items.some((m: { to: string }) => m.to.includes(a.users.tuner.email))).toBe(false);
    expect((await ownerB.get(`/api/outbox/${mine.id}`)).status).toBe(404);
    expect((await ownerB.get(`/api/outbox/${mine.id}/attachments/0`)).status).toBe(404);
  });
});
