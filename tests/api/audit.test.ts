import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';

let t: TestApp;
let a: TestShop;

beforeAll(async () => {
  t = await createTestApp();
  a = await t.createShop('Ledger Shop');
});
afterAll(() => t.close());

const sql = (text: string, params: unknown[] = []) => t.deps.orm.em.fork().getConnection().execute(text, params);

/** Makes the database refuse audit lines of one action, as a failing audit insert would. */
const refuseAudit = (action: string) =>
  sql(`alter table audit_entry add constraint test_refuse_audit check (action <> '${action.replace(/'/g, '')}') not valid`);

afterEach(() => sql('alter table audit_entry drop constraint if exists test_refuse_audit'));

const auditRows = (entityId: string) => sql(`select action from audit_entry where entity_id = ?`, [entityId]) as Promise<{ action: string }[]>;

describe('audit lines commit with their change', () => {
  it('writes the change and its audit line together', async () => {
    const desk = await t.signIn(a.users.desk);
    const res = await desk.put(`/api/customers/${a.customer.id}`).send({ name: 'Renamed Rider' });
    expect(res.status).toBe(200);
    const [row] = (await sql('select name from customer where id = ?', [a.customer.id])) as { name: string }[];
    expect(row.name).toBe('Renamed Rider');
    expect((await auditRows(a.customer.id)).map((r) => r.action)).toContain('customer.update');
  });

  it('leaves a customer unchanged when its audit line cannot be written', async () => {
    const desk = await t.signIn(a.users.desk);
    const [before] = (await sql('select name from customer where id = ?', [a.customer.id])) as { name: string }[];
    const auditBefore = (await auditRows(a.customer.id)).length;
    await refuseAudit('customer.update');
    const res = await desk.put(`/api/customers/${a.customer.id}`).send({ name: 'Never Saved' });
    expect(res.status).toBe(500);
    const [after] = (await sql('select name from customer where id = ?', [a.customer.id])) as { name: string }[];
    expect(after.name).toBe(before.name);
    expect((await auditRows(a.customer.id)).length).toBe(auditBefore);
  });

  it('creates no bike when its audit line cannot be written', async () => {
    const desk = await t.signIn(a.users.desk);
    await refuseAudit('bike.create');
    const res = await desk.post('/api/bikes').send({ customerId: a.customer.id, make: 'Unlogged', model: 'Ghost' });
    expect(res.status).toBe(500);
    const rows = (await sql(`select id from bike where make = 'Unlogged'`)) as unknown[];
    expect(rows).toEqual([]);
  });

  it('keeps a stage and its parts when the audit line of its removal cannot be written', async () => {
    const tuner = await t.signIn(a.users.tuner);
    const created = await tuner.post('/api/stages').send({ bikeId: a.bike.id, name: 'Kept stage', parts: [{ category: 'exhaust', description: 'Invented slip-on', partCost: 10 }] });
    expect(created.status).toBe(201);
    await refuseAudit('stage.delete');
    expect((await tuner.delete(`/api/stages/${created.body.id}`)).status).toBe(500);
    expect(((await sql('select id from stage where id = ?', [created.body.id])) as unknown[]).length).toBe(1);
    expect(((await sql('select id from part where stage_id = ?', [created.body.id])) as unknown[]).length).toBe(1);
  });
});

describe('audit log list', () => {
  it('answers a page and follows nextCursor to older entries without repeats', async () => {
    const desk = await t.signIn(a.users.desk);
    for (const name of ['Cursor One', 'Cursor Two', 'Cursor Three']) expect((await desk.post('/api/customers').send({ name })).status).toBe(201);
    const owner = await t.signIn(a.users.owner);
    const first = await owner.get('/api/audit').query({ kinds: 'customer', limit: 2 });
    expect(first.status).toBe(200);
    expect(first.body.items).toHaveLength(2);
    expect(first.body.pageSize).toBe(2);
    expect(first.body.nextCursor).toBe(first.body.items[1].at);
    const all = (await owner.get('/api/audit').query({ kinds: 'customer', limit: 500 })).body;
    expect(first.body.total).toBe(all.items.length);
    expect(all.nextCursor).toBeNull();
    const second = await owner.get('/api/audit').query({ kinds: 'customer', limit: 2, before: first.body.nextCursor });
    const seen = [...first.body.items, ...second.body.items].map((e: { id: string }) => e.id);
    expect(new Set(seen).size).toBe(seen.length);
    expect(seen).toEqual(all.items.slice(0, seen.length).map((e: { id: string }) => e.id));
  });
});
