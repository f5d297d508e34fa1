/**
 * Build plans against the real app, PostgreSQL, the SMTP fake and the local payment service
 * (through the official SDK): the prediction is the finder's typical outcome, the lifecycle and
 * versions, acceptance by link with its audit line, the signed webhook (checked against the SDK's
 * own constructEvent), tampered / replayed / wrong-amount events, refunds and conversion.
 * Makes, engine families and people are invented.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { randomUUID } from 'node:crypto';
import { median } from 'simple-statistics';
import Stripe from 'stripe';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';
import { latestMailTo, linkIn } from '../support/mail';
import { Bike } from '@server/modules/bikes/bike.entity';
import { addArchiveBike as addBike, straightCurve as curve } from '../support/plan-fixtures';
import { Customer } from '@server/modules/customers/customer.entity';
import { Stage } from '@server/modules/stages/stage.entity';
import { Run } from '@server/modules/runs/run.entity';
import { Shop } from '@server/modules/shops/shop.entity';
import { AuditEntry } from '@server/modules/audit/audit-entry.entity';
import { Plan } from '@server/modules/plans/plan.entity';

let t: TestApp;
let a: TestShop;
let b: TestShop;
let server: http.Server;
let stripe: Stripe;
let endpointId: string;
const WHSEC = process.env.PAYMENTS_WEBHOOK_SECRET!;

const camHeads = [6, 9, 11];
const headsOnly = [10, 12, 8, 15, 9, 11];
const camOnly = [7, 5, 9, 6, 8];

beforeAll(async () => {
  t = await createTestApp();
  a = await t.createShop('Plan Alpha');
  b = await t.createShop('Plan Beta');
  const em = t.deps.orm.em.fork();
  const other = em.create(Customer, { shop: em.getReference(Shop, a.shop.id), name: 'Archive Rider' } as Customer);
  for (const [i, g] of headsOnly.entries()) await addBike(em, a.shop.id, other, 1600 + i * 10, [{ peak: g, parts: [{ category: 'cylinder-heads', level: 'mild-port', cost: 150_000 }] }]);
  for (const [i, g] of camOnly.entries()) await addBike(em, a.shop.id, other, 1610 + i * 10, [{ peak: g, parts: [{ category: 'camshaft', cost: 90_000 }] }]);
  for (const [i, g] of camHeads.entries()) await addBike(em, a.shop.id, other, 1620 + i * 10, [{ peak: g, parts: [{ category: 'camshaft' }, { category: 'cylinder-heads', level: 'mild-port' }] }]);
  // The planned bike's latest reference run (the band is drawn over it).
  const planned = await em.findOneOrFail(Bike, a.bike.id);
  planned.engineFamily = 'Vantor 103';
  const shop = em.getReference(Shop, a.shop.id);
  const stage = em.create(Stage, { shop, bike: planned, position: 0, name: 'Baseline' } as Stage);
  stage.referenceRun = em.create(Run, { shop, bike: planned, stage, sequence: 1, rawKey: 'k/planned', rawSha256: 'a'.repeat(64), rawSizeBytes: 10, originalName: 'p.csv', status: 'ready', warnings: [], tags: [], curve: curve(0), correctionFactor: 1, peakPowerHp: 100 } as unknown as Run);
  await em.flush();

  // The app on a port, registered with the payment service as a webhook endpoint (as a deployment would be).
  server = http.createServer(t.app);
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  const url = new URL(process.env.PAYMENTS_API_URL!);
  stripe = new Stripe(process.env.PAYMENTS_SECRET_KEY!, { host: url.hostname, port: Number(url.port), protocol: 'http', maxNetworkRetries: 0 });
  endpointId = (await stripe.webhookEndpoints.create({ url: `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/payments/webhook`, enabled_events: ['checkout.session.completed'] })).id;
});
afterAll(async () => {
  await stripe.webhookEndpoints.del(endpointId).catch(() => undefined);
  await new Promise<void>((r) => server.close(() => r()));
  await t.close();
});

const heads = { category: 'cylinder-heads', description: 'Mild port and valve job', partCostCents: 60_000, labourCostCents: 90_050, headWork: 'mild-port' };
const cam = { category: 'camshaft', description: 'Bolt-in cam set', partCostCents: 55_000, labourCostCents: 40_000 };

describe('plan prediction', () => {
  it('for one category equals GET /api/builds/typical for that bike and category', async () => {
    const owner = await t.signIn(a.users.owner);
    const res = await owner.post(`/api/bikes/${a.bike.id}/plans`).send({ title: 'Heads', items: [heads] });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.status).toBe('draft');
    expect(res.body.totalCostCents).toBe(150_050);
    const typical = (await owner.get('/api/builds/typical').query({ bikeId: a.bike.id, category: 'cylinder-heads', level: 'mild-port' })).body;
    const p = res.body.prediction;
    expect(p.kind).toBe('single');
    expect(p.count).toBe(typical.count);
    expect(p.peakPowerGainHp).toEqual(typical.peakPowerGainHp);
    expect(p.averagePowerGainHp).toEqual(typical.averagePowerGainHp);
    expect(p.builds.map((x: { stageId: string }) => x.stageId)).toEqual(typical.builds.map((x: { stageId: string }) => x.stageId));
    expect(p.message).toBe(typical.message);
    // Six heads-only builds and three cam + heads builds: the median by simple-statistics.
    expect(p.count).toBe(9);
    expect(p.peakPowerGainHp.median).toBeCloseTo(median([...headsOnly, ...camHeads]), 9);
    expect(p.costPerHpCents).toBe(Math.round(150_050 / median([...headsOnly, ...camHeads])));
    expect(p.disclaimer).toMatch(/not a promise/);
    // The band over the planned bike's baseline: each build's gain is (its step) × rpm / 6000 here.
    expect(p.band.baseRunId).toBeTruthy();
    const at6000 = p.band.rpm.indexOf(6000);
    expect(p.band.gainMedianHp[at6000]).toBeCloseTo(median([...headsOnly, ...camHeads]), 6);
    expect(p.band.basePowerHp[at6000]).toBeCloseTo(100, 6);
  });

  it('for several categories falls back to the sum of single-category medians when few builds added them together', async () => {
    const owner = await t.signIn(a.users.tuner);
    const res = await owner.post(`/api/bikes/${a.bike.id}/plans`).send({ title: 'Cam and heads', items: [cam, heads] });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const p = res.body.prediction;
    expect(p.kind).toBe('estimate');
    expect(p.count).toBe(3);
    expect(p.lowConfidence).toBe(true);
    const single = async (q: Record<string, string>) => (await owner.get('/api/builds/typical').query({ bikeId: a.bike.id, ...q })).body.peakPowerGainHp.median as number;
    const expected = (await single({ category: 'camshaft' })) + (await single({ category: 'cylinder-heads', level: 'mild-port' }));
    expect(p.estimate.peakPowerGainHp).toBeCloseTo(expected, 9);
    // Camshaft: camOnly and camHeads; heads: headsOnly and camHeads (simple-statistics medians).
    expect(expected).toBeCloseTo(median([...camOnly, ...camHeads]) + median([...headsOnly, ...camHeads]), 9);
    expect(p.message).toMatch(/Estimate/);
  });
});

describe('plan lifecycle', () => {
  it('edits a draft, sends versions with a PDF and a link, and refuses edits once sent', async () => {
    const desk = await t.signIn(a.users.desk);
    const created = (await desk.post(`/api/bikes/${a.bike.id}/plans`).send({ title: 'Heads', items: [heads] })).body;
    const edited = await desk.put(`/api/plans/${created.id}`).send({ title: 'Heads, revised', items: [heads, cam] });
    expect(edited.status).toBe(200);
    expect(edited.body.totalCostCents).toBe(150_050 + 95_000);
    const sent = await desk.post(`/api/plans/${created.id}/send`).send({});
    expect(sent.status, JSON.stringify(sent.body)).toBe(200);
    expect(sent.body.plan.status).toBe('sent');
    expect(sent.body.plan.version).toBe(1);
    const mail = await latestMailTo(a.customer.email!);
    expect(mail.attachments[0].contentType).toBe('application/pdf');
    expect(mail.attachments[0].content.subarray(0, 5).toString()).toBe('%PDF-');
    const token1 = linkIn(mail.text, '/plan/');
    expect((await desk.put(`/api/plans/${created.id}`).send({ title: 'x', items: [cam] })).body.error.code).toBe('PLAN_STATE');
    expect((await desk.post(`/api/plans/${created.id}/revise`)).body.status).toBe('draft');
    await desk.put(`/api/plans/${created.id}`).send({ title: 'Heads only', items: [heads] });
    const v2 = await desk.post(`/api/plans/${created.id}/send`).send({});
    expect(v2.body.plan.version).toBe(2);
    const versions = (await desk.get(`/api/plans/${created.id}/versions`)).body.items;
    expect(versions.map((v: { version: number; totalCostCents: number }) => [v.version, v.totalCostCents])).toEqual([[2, 150_050], [1, 245_050]]);
    // The first link was replaced by the second.
    expect((await t.request.get(`/api/plan-links/${token1}`)).status).toBe(404);
    const token2 = new URL(v2.body.url).pathname.split('/').pop()!;
    const pub = await t.request.get(`/api/plan-links/${token2}`);
    expect(pub.status).toBe(200);
    expect(pub.body.plan.title).toBe('Heads only');
    expect((await t.request.get(pub.body.pdfUrl)).headers['content-type']).toBe('application/pdf');
  });

  it('accepts from the link with a typed name, recording name, time, IP and version in the audit log', async () => {
    const desk = await t.signIn(a.users.desk);
    const plan = (await desk.post(`/api/bikes/${a.bike.id}/plans`).send({ title: 'Heads', items: [heads] })).body;
    const { url } = (await desk.post(`/api/plans/${plan.id}/send`).send({})).body;
    const token = new URL(url).pathname.split('/').pop()!;
    const res = await t.request.post(`/api/plan-links/${token}/accept`).send({ name: 'Robin Quill' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.status).toBe('accepted');
    expect(res.body.acceptedName).toBe('Robin Quill');
    const em = t.deps.orm.em.fork();
    const entry = await em.findOneOrFail(AuditEntry, { entityId: plan.id, action: 'plan.accept' });
    expect(entry.details).toMatchObject({ name: 'Robin Quill', version: 1, via: 'plan link' });
    expect(String(entry.details!.ip)).toMatch(/127\.0\.0\.1/);
    expect(Number.isNaN(Date.parse(String(entry.details!.at)))).toBe(false);
    // Accepting twice, or declining after, is refused.
    expect((await t.request.post(`/api/plan-links/${token}/decline`).send({})).status).toBe(409);
  });

  it('lets the signed-in customer decline their own plan, and hides drafts and other customers’ plans', async () => {
    const desk = await t.signIn(a.users.desk);
    const draft = (await desk.post(`/api/bikes/${a.bike.id}/plans`).send({ title: 'Draft', items: [cam] })).body;
    const others = (await desk.post(`/api/bikes/${a.otherBike.id}/plans`).send({ title: 'Other', items: [cam] })).body;
    await desk.post(`/api/plans/${others.id}/send`).send({ to: 'other@plan-alpha.test' });
    const customer = await t.signIn(a.users.customer);
    expect((await customer.get(`/api/plans/${draft.id}`)).status).toBe(404);
    expect((await customer.get(`/api/plans/${others.id}`)).status).toBe(404);
    expect((await customer.post(`/api/plans/${others.id}/accept`).send({ name: 'Somebody Else' })).status).toBe(404);
    await desk.post(`/api/plans/${draft.id}/send`).send({});
    const declined = await customer.post(`/api/plans/${draft.id}/decline`).send({ reason: 'Not this season' });
    expect(declined.body.status).toBe('declined');
    expect(declined.body.declineReason).toBe('Not this season');
    const ownerB = await t.signIn(b.users.owner);
    expect((await ownerB.get(`/api/plans/${draft.id}`)).status).toBe(404);
  });
});

async function acceptedPlanWithDeposit() {
  const owner = await t.signIn(a.users.owner);
  const shop = (await owner.get('/api/shop')).body;
  await owner.put('/api/shop').send({ name: shop.name, units: shop.units, paperSize: shop.paperSize, defaultCorrection: shop.defaultCorrection, currency: 'EUR', depositMode: 'percent', depositPercent: 25 });
  const plan = (await owner.post(`/api/bikes/${a.bike.id}/plans`).send({ title: 'Heads', items: [heads] })).body;
  const { url } = (await owner.post(`/api/plans/${plan.id}/send`).send({})).body;
  const token = new URL(url).pathname.split('/').pop()!;
  await t.request.post(`/api/plan-links/${token}/accept`).send({ name: 'Robin Quill' });
  return { owner, planId: plan.id as string, token };
}

async function planRow(id: string) {
  return t.deps.orm.em.fork().findOneOrFail(Plan, id);
}

describe('deposit', () => {
  it('is confirmed only by the signed webhook, after paying on the hosted checkout; then it can be refunded', async () => {
    const { owner, planId, token } = await acceptedPlanWithDeposit();
    const before = await planRow(planId);
    expect(before.currency).toBe('eur');
    expect(before.depositCents).toBe(Math.round(150_050 * 0.25)); // 37,512.5 → 37,513 (half up)
    const { url } = (await t.request.post(`/api/plan-links/${token}/deposit`)).body;
    expect(url).toMatch(/\/checkout\/cs_test_/);
    expect((await planRow(planId)).depositPaidCents).toBe(0);
    const page = await (await fetch(url)).text();
    expect(page).toContain('>Pay</button>');
    const paid = await fetch(`${url}/pay`, { method: 'POST', redirect: 'manual' });
    expect(paid.status).toBe(303);
    const after = await planRow(planId);
    expect(after.depositPaidCents).toBe(37_513);
    expect(after.paymentIntentId).toMatch(/^pi_/);
    expect((await t.request.post(`/api/plan-links/${token}/deposit`)).body.error.code).toBe('DEPOSIT_NOT_DUE');

    const refunded = await owner.post(`/api/plans/${planId}/refund`).send({ reason: 'Customer withdrew' });
    expect(refunded.status, JSON.stringify(refunded.body)).toBe(200);
    expect(refunded.body.depositRefundedCents).toBe(37_513);
    expect(refunded.body.status).toBe('declined');
    expect((await owner.post(`/api/plans/${planId}/refund`).send({})).body.error.code).toBe('DEPOSIT_NOT_DUE');
  });

  it('changes nothing for a tampered, replayed or wrong-amount webhook; the app agrees with the SDK’s constructEvent', async () => {
    const { planId, token } = await acceptedPlanWithDeposit();
    const { url } = (await t.request.post(`/api/plan-links/${token}/deposit`)).body;
    const sessionId = new URL(url).pathname.split('/').pop()!;
    const session = await stripe.checkout.sessions.retrieve(sessionId);
    const event = (amount: number, id = `evt_test_${randomUUID()}`) =>
      JSON.stringify({ id, object: 'event', type: 'checkout.session.completed', created: Math.floor(Date.now() / 1000), data: { object: { ...session, payment_status: 'paid', status: 'complete', payment_intent: 'pi_test_x', amount_total: amount } } });
    const post = (body: string, signature: string) => t.request.post('/api/payments/webhook').set('Content-Type', 'application/json').set('Stripe-Signature', signature).send(body);
    const sign = (payload: string, secret = WHSEC) => stripe.webhooks.generateTestHeaderString({ payload, secret });

    // Tampered: signed for one amount, sent with another. The SDK refuses it, and so does the app.
    const good = event(37_513);
    const header = sign(good);
    const tampered = good.replace('37513', '1');
    expect(() => stripe.webhooks.constructEvent(tampered, header, WHSEC)).toThrow();
    expect((await post(tampered, header)).status).toBe(400);
    // Signed with another secret.
    expect((await post(good, sign(good, 'whsec_someone_else'))).status).toBe(400);
    // Wrong amount, correctly signed.
    const wrong = event(100);
    expect(stripe.webhooks.constructEvent(wrong, sign(wrong), WHSEC).id).toBeTruthy();
    expect((await post(wrong, sign(wrong))).body.outcome).toBe('amount-mismatch');
    expect((await planRow(planId)).depositPaidCents).toBe(0);
    // The real one, then the same event again.
    expect((await post(good, header)).body.outcome).toBe('paid');
    expect((await post(good, sign(good))).body.outcome).toBe('duplicate');
    // Another event id for the same payment: already paid, counted once.
    const again = event(37_513);
    expect((await post(again, sign(again))).body.outcome).toBe('already-paid');
    expect((await planRow(planId)).depositPaidCents).toBe(37_513);
  });
});

describe('convert', () => {
  it('turns an accepted plan into the next stage with its parts, then shows predicted against measured', async () => {
    const { owner, planId } = await acceptedPlanWithDeposit();
    const res = await owner.post(`/api/plans/${planId}/convert`).send({ name: 'Stage 1 — heads' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.status).toBe('converted');
    expect(res.body.outcome.position).toBe('not-measured');
    const stages = (await owner.get('/api/stages').query({ bikeId: a.bike.id })).body.items;
    const stage = stages.find((s: { id: string }) => s.id === res.body.convertedStageId);
    expect(stage.name).toBe('Stage 1 — heads');
    expect(stage.parts).toMatchObject([{ category: 'cylinder-heads', partCostCents: 60_000, labourCostCents: 90_050, headWorkLevel: 'mild-port' }]);
    expect(stage.totalCostCents).toBe(150_050);
    // The stage is measured: +13 hp on top of the baseline (set directly; the triggers refresh build_index).
    await t.deps.orm.em.fork().getConnection().execute('update stage set gain_peak_power_hp = 13, gain_average_power_hp = 6 where id = ?', [stage.id]);
    const plan = (await owner.get(`/api/plans/${planId}`)).body;
    expect(plan.outcome.measuredPeakPowerGainHp).toBe(13);
    expect(plan.outcome.predictedMedianPeakHp).toBeCloseTo(median([...headsOnly, ...camHeads]), 9);
    expect(plan.outcome.position).toBe('above');
  });
});
