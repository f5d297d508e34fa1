import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';
import { CC_PER_CUBIC_INCH } from '@shared/displacement';

let t: TestApp;
let a: TestShop;
let b: TestShop;

beforeAll(async () => {
  t = await createTestApp();
  a = await t.createShop('Alpha Shop');
  b = await t.createShop('Beta Shop');
});
afterAll(() => t.close());

describe('customers', () => {
  it('creates a customer and finds it by search, sorted and paged', async () => {
    const desk = await t.signIn(a.users.desk);
    for (const name of ['Zed Quill', 'Amy Quill', 'Mo Quill']) {
      expect((await desk.post('/api/customers').send({ name, email: `${name.split(' ')[0].toLowerCase()}@quill.test` })).status).toBe(201);
    }
    const res = await desk.get('/api/customers').query({ q: 'quill', sort: '-name', pageSize: 2 });
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(3);
    expect(res.body.items.map((c: { name: string }) => c.name)).toEqual(['Zed Quill', 'Mo Quill']);
    const page2 = await desk.get('/api/customers').query({ q: 'quill', sort: '-name', pageSize: 2, page: 2 });
    expect(page2.body.items.map((c: { name: string }) => c.name)).toEqual(['Amy Quill']);
  });

  it('answers 400 with field messages for a bad body', async () => {
    const desk = await t.signIn(a.users.desk);
    const res = await desk.post('/api/customers').send({ name: '', email: 'not-an-email' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('VALIDATION_FAILED');
    const paths = res.body.error.details.fields.map((f: { path: string }) => f.path);
    expect(paths).toEqual(expect.arrayContaining(['name', 'email']));
  });

  it('refuses an unknown sort field', async () => {
    const desk = await t.signIn(a.users.desk);
    expect((await desk.get('/api/customers').query({ sort: 'password' })).status).toBe(400);
  });

  it('keeps each shop’s customers to itself', async () => {
    const deskA = await t.signIn(a.users.desk);
    const deskB = await t.signIn(b.users.desk);
    const listB = await deskB.get('/api/customers').query({ pageSize: 200 });
    expect(listB.body.items.some((c: { id: string }) => c.id === a.customer.id)).toBe(false);
    expect((await deskB.get(`/api/customers/${a.customer.id}`)).status).toBe(404);
    expect((await deskB.put(`/api/customers/${a.customer.id}`).send({ name: 'Hijacked' })).status).toBe(404);
    expect((await deskA.get(`/api/customers/${a.customer.id}`)).body.name).toBe(a.customer.name);
  });
});

describe('bikes', () => {
  it('finds a bike by make, model, VIN, engine family or owner, across words, and after renames', async () => {
    const desk = await t.signIn(a.users.desk);
    const owner = (await desk.post('/api/customers').send({ name: 'Wrenfield Okoro' })).body;
    const bike = (await desk.post('/api/bikes').send({ customerId: owner.id, make: 'Zephrane', model: 'Longhaul 117', vin: '1M8GDM9AXKP042788', engineFamily: 'Quarrel Twin', displacement: 1917, displacementUnit: 'cc', cylinders: 2 })).body;
    const found = async (q: string) => ((await desk.get('/api/bikes').query({ q })).body.items as { id: string }[]).map((x) => x.id);
    for (const q of ['zephrane', 'LONGHAUL', 'kp042788', 'quarrel tw', 'okoro', 'zephrane longhaul']) expect(await found(q), q).toEqual([bike.id]);
    expect(await found('longhaul zephrane')).toEqual([]);
    // Renaming the bike or its owner moves what the search finds.
    await desk.put(`/api/bikes/${bike.id}`).send({ customerId: owner.id, make: 'Zephrane', model: 'Shortrun 90', vin: '1M8GDM9AXKP042788', engineFamily: 'Quarrel Twin', displacement: 1917, displacementUnit: 'cc', cylinders: 2 });
    expect(await found('longhaul')).toEqual([]);
    expect(await found('shortrun')).toEqual([bike.id]);
    await desk.put(`/api/customers/${owner.id}`).send({ name: 'Wrenfield Adeyemi' });
    expect(await found('okoro')).toEqual([]);
    expect(await found('adeyemi')).toEqual([bike.id]);
    // Another shop's desk finds nothing of it.
    const other = await t.signIn(b.users.desk);
    expect((await other.get('/api/bikes').query({ q: 'zephrane' })).body.items).toEqual([]);
  });

  it('stores displacement entered in cubic inches as cm³ (1 in³ = 16.387064 cm³, NIST SP 811)', async () => {
    const desk = await t.signIn(a.users.desk);
    const res = await desk.post('/api/bikes').send({ customerId: a.customer.id, make: 'Testmake', model: 'Cubic', displacement: 107, displacementUnit: 'ci', cylinders: 2 });
    expect(res.status).toBe(201);
    expect(res.body.displacementCc).toBeCloseTo(107 * 16.387064, 1);
    expect(CC_PER_CUBIC_INCH).toBe(16.387064);
  });

  it('validates the VIN check digit (49 CFR 565)', async () => {
    const desk = await t.signIn(a.users.desk);
    // 1M8GDM9AXKP042788 is the worked example VIN with check digit X (from memory of the
    // commonly reproduced 49 CFR 565 illustration); changing the check digit must fail.
    const good = await desk.post('/api/bikes').send({ customerId: a.customer.id, make: 'T', model: 'V', vin: '1m8gdm9axkp042788' });
    expect(good.status).toBe(201);
    expect(good.body.vin).toBe('1M8GDM9AXKP042788');
    const bad = await desk.post('/api/bikes').send({ customerId: a.customer.id, make: 'T', model: 'V', vin: '1M8GDM9A1KP042788' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.fields[0].path).toBe('vin');
    expect(bad.body.error.details.fields[0].message).toMatch(/check digit/);
  });

  it('lets a customer see only their own bikes, read-only', async () => {
    const customer = await t.signIn(a.users.customer);
    const list = await customer.get('/api/bikes');
    expect(list.status).toBe(200);
    const ids = list.body.items.map((x: { id: string }) => x.id);
    expect(ids).toContain(a.bike.id);
    expect(ids).not.toContain(a.otherBike.id);
    expect((await customer.get(`/api/bikes/${a.otherBike.id}`)).status).toBe(404);
    expect((await customer.get(`/api/bikes/${a.bike.id}`)).status).toBe(200);
    expect((await customer.post('/api/bikes').send({ customerId: a.customer.id, make: 'X', model: 'Y' })).status).toBe(403);
    expect((await customer.put(`/api/bikes/${a.bike.id}`).send({ customerId: a.customer.id, make: 'X', model: 'Y' })).status).toBe(403);
  });

  it('keeps bikes inside their shop', async () => {
    const ownerB = await t.signIn(b.users.owner);
    expect((await ownerB.get(`/api/bikes/${a.bike.id}`)).status).toBe(404);
    expect((await ownerB.put(`/api/bikes/${a.bike.id}`).send({ customerId: b.customer.id, make: 'X', model: 'Y' })).status).toBe(404);
    // Nor can a bike of shop B be given to a customer of shop A.
    expect((await ownerB.post('/api/bikes').send({ customerId: a.customer.id, make: 'X', model: 'Y' })).status).toBe(404);
    const list = await ownerB.get('/api/bikes').query({ pageSize: 200 });
    expect(list.body.items.every((x: { customerId: string }) => x.customerId !== a.customer.id)).toBe(true);
  });

  it('suggests engine families already used in the shop', async () => {
    const desk = await t.signIn(a.users.desk);
    const res = await desk.get('/api/bikes/engine-families');
    expect(res.body.items).toContain('TM-100');
  });
});

describe('health', () => {
  it('reports database and storage state', async () => {
    const res = await t.request.get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body.database.ok).toBe(true);
    expect(res.body.storage.ok).toBe(true);
  });

  it('answers 503 naming the part that is down, without internals, when storage is unreachable', async () => {
    const down = await createTestApp({ env: { S3_ENDPOINT: 'http://127.0.0.1:1' } });
    try {
      const res = await down.request.get('/api/health');
      expect(res.status).toBe(503);
      expect(res.body).toEqual({ status: 'degraded', database: { ok: true }, storage: { ok: false } });
    } finally {
      await down.close();
    }
  });
});
