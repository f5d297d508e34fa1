/**
 * The local payment service must be indistinguishable from the provider for the official SDK:
 * the SDK creates and reads checkouts and refunds through it, and its webhooks verify with the
 * SDK's own `webhooks.constructEvent` (the provider's documented signature scheme), while a
 * tampered body or a wrong secret does not.
 */
import { afterEach, describe, expect, it } from 'vitest';
import express from 'express';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import type http from 'node:http';
import Stripe from 'stripe';
import { startPaymentFake } from '../../scripts/lib/payment-fake';
import { freePort } from '../../scripts/lib/local-services';

const KEY = 'sk_test_local_fake_key';
const WHSEC = 'whsec_local_fake_secret';
const cleanups: (() => Promise<void> | void)[] = [];
afterEach(async () => {
  while (cleanups.length) await cleanups.pop()!();
});

async function setup() {
  const hooks: { body: string; signature: string }[] = [];
  const app = express();
  app.post('/hook', express.raw({ type: 'application/json' }), (req, res) => {
    hooks.push({ body: (req.body as Buffer).toString('utf8'), signature: String(req.headers['stripe-signature']) });
    res.status(200).json({ received: true });
  });
  const hookServer = await new Promise<http.Server>((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  cleanups.push(() => new Promise<void>((r) => hookServer.close(() => r())));
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'pullbook-pay-'));
  cleanups.push(() => fs.rmSync(dir, { recursive: true, force: true }));
  const port = await freePort();
  const fake = await startPaymentFake({ dir, port, secretKey: KEY, webhookUrl: `http://127.0.0.1:${(hookServer.address() as AddressInfo).port}/hook`, webhookSecret: WHSEC });
  cleanups.push(() => fake.stop());
  const stripe = new Stripe(KEY, { host: '127.0.0.1', port, protocol: 'http', maxNetworkRetries: 0 });
  return { stripe, fake, hooks, dir };
}

async function createCheckout(stripe: Stripe, amount = 25_000) {
  return stripe.checkout.sessions.create({
    mode: 'payment',
    line_items: [{ quantity: 1, price_data: { currency: 'usd', unit_amount: amount, product_data: { name: 'Deposit for plan P-1' } } }],
    success_url: 'http://127.0.0.1:9/plans/p1?paid={CHECKOUT_SESSION_ID}',
    cancel_url: 'http://127.0.0.1:9/plans/p1',
    metadata: { planId: 'p1', planVersion: '2' },
  });
}

describe('local payment service with the official SDK', () => {
  it('creates a checkout, pays it from the hosted page and sends a webhook the SDK verifies', async () => {
    const { stripe, hooks } = await setup();
    const session = await createCheckout(stripe);
    expect(session.amount_total).toBe(25_000);
    expect(session.payment_status).toBe('unpaid');
    expect(session.metadata).toEqual({ planId: 'p1', planVersion: '2' });

    const page = await (await fetch(session.url!)).text();
    expect(page).toContain('>Pay</button>');
    expect(page).toContain('$250.00');

    const paid = await fetch(`${session.url}/pay`, { method: 'POST', redirect: 'manual' });
    expect(paid.status).toBe(303);
    expect(paid.headers.get('location')).toBe(`http://127.0.0.1:9/plans/p1?paid=${session.id}`);

    expect(hooks).toHaveLength(1);
    const event = stripe.webhooks.constructEvent(hooks[0].body, hooks[0].signature, WHSEC);
    expect(event.type).toBe('checkout.session.completed');
    const obj = event.data.object as Stripe.Checkout.Session;
    expect(obj.id).toBe(session.id);
    expect(obj.payment_status).toBe('paid');
    expect(obj.amount_total).toBe(25_000);

    // Paying twice sends no second event.
    await fetch(`${session.url}/pay`, { method: 'POST', redirect: 'manual' });
    expect(hooks).toHaveLength(1);
    const again = await stripe.checkout.sessions.retrieve(session.id);
    expect(again.payment_intent).toBe(obj.payment_intent);
  });

  it('signs so that a tampered body or another secret fails verification', async () => {
    const { stripe, hooks } = await setup();
    const session = await createCheckout(stripe, 10_000);
    await fetch(`${session.url}/pay`, { method: 'POST', redirect: 'manual' });
    const { body, signature } = hooks[0];
    expect(() => stripe.webhooks.constructEvent(body.replace('10000', '1'), signature, WHSEC)).toThrow();
    expect(() => stripe.webhooks.constructEvent(body, signature, 'whsec_someone_else')).toThrow();
  });

  it('refunds a paid checkout through the SDK, never more than was paid', async () => {
    const { stripe, hooks } = await setup();
    const session = await createCheckout(stripe, 30_000);
    await fetch(`${session.url}/pay`, { method: 'POST', redirect: 'manual' });
    const pi = (stripe.webhooks.constructEvent(hooks[0].body, hooks[0].signature, WHSEC).data.object as Stripe.Checkout.Session).payment_intent as string;
    const part = await stripe.refunds.create({ payment_intent: pi, amount: 10_000 });
    expect(part.amount).toBe(10_000);
    await expect(stripe.refunds.create({ payment_intent: pi, amount: 25_000 })).rejects.toThrow(/between 1 and 20000/);
    const rest = await stripe.refunds.create({ payment_intent: pi });
    expect(rest.amount).toBe(20_000);
  });

  it('refuses a wrong API key and a checkout without an amount, as the provider does', async () => {
    const { stripe } = await setup();
    const port = Number(new URL((await createCheckout(stripe)).url!).port);
    const stranger = new Stripe('sk_test_wrong', { host: '127.0.0.1', port, protocol: 'http', maxNetworkRetries: 0 });
    await expect(createCheckout(stranger)).rejects.toThrow(/Invalid API key/);
    await expect(stripe.checkout.sessions.create({ mode: 'payment', success_url: 'http://x/', line_items: [] })).rejects.toThrow(/line_items/);
  });

  it('keeps its state on disk across a restart', async () => {
    const { stripe, fake, dir } = await setup();
    const session = await createCheckout(stripe);
    await fake.stop();
    const port = Number(new URL(session.url!).port);
    const again = await startPaymentFake({ dir, port, secretKey: KEY, webhookUrl: 'http://127.0.0.1:9/none', webhookSecret: WHSEC });
    cleanups.push(() => again.stop());
    expect((await stripe.checkout.sessions.retrieve(session.id)).amount_total).toBe(25_000);
  });

  it('delivers to webhook endpoints registered through the SDK, signed with the secret it answers, until deleted', async () => {
    const { stripe, hooks } = await setup();
    const extra: string[] = [];
    const app = express();
    app.post('/other', express.raw({ type: 'application/json' }), (req, res) => {
      extra.push((req.body as Buffer).toString('utf8'));
      res.json({ ok: true });
    });
    const other = await new Promise<http.Server>((resolve) => {
      const s = app.listen(0, '127.0.0.1', () => resolve(s));
    });
    cleanups.push(() => new Promise<void>((r) => other.close(() => r())));
    const endpoint = await stripe.webhookEndpoints.create({ url: `http://127.0.0.1:${(other.address() as AddressInfo).port}/other`, enabled_events: ['checkout.session.completed'] });
    expect(endpoint.secret).toBe(WHSEC);
    const first = await createCheckout(stripe);
    await fetch(`${first.url}/pay`, { method: 'POST', redirect: 'manual' });
    expect(hooks).toHaveLength(1);
    expect(extra).toHaveLength(1);
    expect(JSON.parse(extra[0]).id).toBe(JSON.parse(hooks[0].body).id);
    await stripe.webhookEndpoints.del(endpoint.id);
    const second = await createCheckout(stripe);
    await fetch(`${second.url}/pay`, { method: 'POST', redirect: 'manual' });
    expect(hooks).toHaveLength(2);
    expect(extra).toHaveLength(1);
  });
});
