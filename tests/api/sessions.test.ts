import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';
import { SAFETY_CHECKS } from '@shared/schemas/run';

/** Dynos and dyno sessions: conditions, the safety checklist, roles and tenants. */
let t: TestApp;
let a: TestShop;
let b: TestShop;

beforeAll(async () => {
  t = await createTestApp();
  a = await t.createShop('Sessions Alpha');
  b = await t.createShop('Sessions Beta');
});
afterAll(() => t.close());

describe('dynos', () => {
  it('lets the owner manage dynos and staff read them', async () => {
    const owner = await t.signIn(a.users.owner);
    const tuner = await t.signIn(a.users.tuner);
    const created = await owner.post('/api/dynos').send({ name: 'Bay 1 roller', kind: 'inertia', notes: '' });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ name: 'Bay 1 roller', kind: 'inertia', notes: null });
    expect((await tuner.post('/api/dynos').send({ name: 'x', kind: 'other' })).status).toBe(403);
    expect((await owner.post('/api/dynos').send({ name: 'x', kind: 'water-brake' })).status).toBe(400);
    const edited = await owner.put(`/api/dynos/${created.body.id}`).send({ name: 'Bay 1 roller', kind: 'eddy-current' });
    expect(edited.body.kind).toBe('eddy-current');
    expect((await tuner.get('/api/dynos')).body.items.map((d: { id: string }) => d.id)).toEqual([created.body.id]);
    const bOwner = await t.signIn(b.users.owner);
    expect((await bOwner.get('/api/dynos')).body.items).toEqual([]);
    expect((await bOwner.put(`/api/dynos/${created.body.id}`).send({ name: 'x', kind: 'other' })).status).toBe(404);
    expect((await bOwner.delete(`/api/dynos/${created.body.id}`)).status).toBe(404);
    const customer = await t.signIn(a.users.customer);
    expect((await customer.get('/api/dynos')).status).toBe(403);
  });
});

describe('sessions', () => {
  it('records conditions, the operator and who confirmed the safety checks', async () => {
    const owner = await t.signIn(a.users.owner);
    const tuner = await t.signIn(a.users.tuner);
    const dyno = await owner.post('/api/dynos').send({ name: 'Bay 2', kind: 'eddy-current' });
    const res = await tuner.post('/api/sessions').send({ bikeId: a.bike.id, dynoId: dyno.body.id, ambientTempC: '23.5', baroKpa: 100.2, humidityPct: '', correctionStandard: 'sae-j1349', notes: 'Hot afternoon' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ bikeId: a.bike.id, dynoName: 'Bay 2', operatorName: a.users.tuner.name, ambientTempC: 23.5, baroKpa: 100.2, humidityPct: null, safetyConfirmedAt: null, runCount: 0 });
    expect((await tuner.post('/api/sessions').send({ bikeId: a.bike.id, baroKpa: 20 })).status).toBe(400);

    const patched = await tuner.patch(`/api/sessions/${res.body.id}`).send({ humidityPct: 40, dynoId: null });
    expect(patched.body).toMatchObject({ humidityPct: 40, dynoId: null, ambientTempC: 23.5 });

    const desk = await t.signIn(a.users.desk);
    expect((await desk.post(`/api/sessions/${res.body.id}/safety-check`).send({ checks: SAFETY_CHECKS.map((c) => c.id) })).status).toBe(403);
    const confirmed = await owner.post(`/api/sessions/${res.body.id}/safety-check`).send({ checks: SAFETY_CHECKS.map((c) => c.id) });
    expect(confirmed.status).toBe(200);
    expect(confirmed.body.safetyConfirmedByName).toBe(a.users.owner.name);
    expect(Date.now() - Date.parse(confirmed.body.safetyConfirmedAt)).toBeLessThan(60_000);

    const list = await desk.get('/api/sessions').query({ bikeId: a.bike.id });
    expect(list.body.items.map((s: { id: string }) => s.id)).toEqual([res.body.id]);
    const audit = await owner.get('/api/audit');
    expect(audit.body.items.map((e: { action: string }) => e.action)).toEqual(expect.arrayContaining(['session.create', 'session.update', 'session.safety-check']));
  });

  it('shows a customer only their own bikes’ sessions and keeps shops apart', async () => {
    const tuner = await t.signIn(a.users.tuner);
    const own = await tuner.post('/api/sessions').send({ bikeId: a.bike.id });
    const other = await tuner.post('/api/sessions').send({ bikeId: a.otherBike.id });
    const customer = await t.signIn(a.users.customer);
    const seen = await customer.get('/api/sessions');
    expect(seen.body.items.every((s: { bikeId: string }) => s.bikeId === a.bike.id)).toBe(true);
    expect((await customer.get(`/api/sessions/${own.body.id}`)).status).toBe(200);
    expect((await customer.get(`/api/sessions/${other.body.id}`)).status).toBe(404);
    expect((await customer.get('/api/sessions').query({ bikeId: a.otherBike.id })).status).toBe(404);
    expect((await customer.patch(`/api/sessions/${own.body.id}`).send({ notes: 'x' })).status).toBe(403);

    const bTuner = await t.signIn(b.users.tuner);
    expect((await bTuner.get(`/api/sessions/${own.body.id}`)).status).toBe(404);
    expect((await bTuner.patch(`/api/sessions/${own.body.id}`).send({ notes: 'x' })).status).toBe(404);
    expect((await bTuner.post(`/api/sessions/${own.body.id}/safety-check`).send({ checks: SAFETY_CHECKS.map((c) => c.id) })).status).toBe(404);
    expect((await bTuner.post('/api/sessions').send({ bikeId: a.bike.id })).status).toBe(404);
    expect((await bTuner.get('/api/sessions')).body.items).toEqual([]);
    // A session of one bike does not take another bike's uploads.
    const wrong = await tuner.post('/api/runs').field('bikeId', a.otherBike.id).field('sessionId', own.body.id).attach('files', Buffer.from('x'), { filename: 'x.csv' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.code).toBe('SESSION_OTHER_BIKE');
  });
});
