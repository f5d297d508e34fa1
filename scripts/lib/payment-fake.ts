/**
 * A local stand-in for the payment provider, on loopback, for `npm start` and `npm test` (like the
 * S3 and SMTP fakes). It speaks the small part of the provider's HTTP API that Pullbook uses, so the
 * official `stripe` SDK talks to it unchanged (`new Stripe(key, { host, port, protocol: 'http' })`):
 *
 *   POST /v1/checkout/sessions        create a hosted checkout (form-encoded, as the SDK sends it)
 *   GET  /v1/checkout/sessions/:id    read it back
 *   POST /v1/refunds                  refund a paid checkout's payment intent, in full or in part
 *   GET  /checkout/:id                the hosted checkout page, with a "Pay" button
 *   POST /checkout/:id/pay            pays, sends the signed `checkout.session.completed` webhook,
 *                                     then redirects to the session's success URL
 *   POST /v1/webhook_endpoints        register another webhook endpoint (as in the provider's API);
 *   DELETE /v1/webhook_endpoints/:id  its answer's `secret` is the fake's one signing secret
 *
 * Webhooks are signed exactly as the provider signs them (the SDK's own
 * `webhooks.generateTestHeaderString`), so the app verifies them with `constructEvent` as it would in
 * production. State is kept in `<dir>/state.json`. Nothing here is used when PAYMENTS_API_URL is
 * unset: then the SDK reaches the real provider.
 */
import express from 'express';
import fs from 'node:fs';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import type http from 'node:http';
import Stripe from 'stripe';

export interface PaymentFakeOptions {
  dir: string;
  port: number;
  /** The secret API key the SDK must present (Authorization: Bearer …). */
  secretKey: string;
  /**
   * Where webhooks go (the app's webhook route) and the secret they are signed with. Endpoints
   * registered through the API get every event too (tests with an app on a port of their own).
   */
  webhookUrl?: string;
  webhookSecret: string;
}

interface FakeSession {
  id: string;
  object: 'checkout.session';
  amount_total: number;
  currency: string;
  status: 'open' | 'complete' | 'expired';
  payment_status: 'unpaid' | 'paid';
  payment_intent: string | null;
  url: string;
  success_url: string;
  cancel_url: string | null;
  client_reference_id: string | null;
  customer_email: string | null;
  metadata: Record<string, string>;
  description: string;
  created: number;
  livemode: false;
}

interface FakeRefund {
  id: string;
  object: 'refund';
  amount: number;
  currency: string;
  payment_intent: string;
  status: 'succeeded';
  metadata: Record<string, string>;
  created: number;
}

interface FakeEndpoint {
  id: string;
  object: 'webhook_endpoint';
  url: string;
  enabled_events: string[];
  status: 'enabled';
  created: number;
}

interface FakeState {
  endpoints?: Record<string, FakeEndpoint>;
  sessions: Record<string, FakeSession>;
  refunds: Record<string, FakeRefund>;
  /** Every webhook sent, with its delivery result (for people debugging a payment). */
  webhooks: { id: string; type: string; at: string; status: number | string }[];
}

const newId = (prefix: string) => `${prefix}_test_${randomBytes(12).toString('hex')}`;
const now = () => Math.floor(Date.now() / 1000);
const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

function providerError(res: express.Response, status: number, message: string, param?: string) {
  res.status(status).json({ error: { type: status === 401 ? 'authentication_error' : 'invalid_request_error', message, param } });
}

export async function startPaymentFake(opts: PaymentFakeOptions): Promise<{ url: string; stop(): Promise<void>; state(): FakeState }> {
  fs.mkdirSync(opts.dir, { recursive: true });
  const stateFile = path.join(opts.dir, 'state.json');
  const state: FakeState = fs.existsSync(stateFile) ? JSON.parse(fs.readFileSync(stateFile, 'utf8')) : { sessions: {}, refunds: {}, webhooks: [] };
  const save = () => fs.writeFileSync(stateFile, JSON.stringify(state, null, 1));
  const base = `http://127.0.0.1:${opts.port}`;
  const signer = new Stripe(opts.secretKey);

  async function sendWebhook(type: string, object: unknown) {
    const event = { id: newId('evt'), object: 'event', type, created: now(), livemode: false, api_version: Stripe.API_VERSION, data: { object } };
    const payload = JSON.stringify(event);
    const targets = [
      ...(opts.webhookUrl ? [opts.webhookUrl] : []),
      ...Object.values(state.endpoints ?? {}).filter((e) => e.enabled_events.includes('*') || e.enabled_events.includes(type)).map((e) => e.url),
    ];
    await Promise.all(targets.map((url) => deliver(url, event.id, type, payload)));
  }

  async function deliver(url: string, eventId: string, type: string, payload: string) {
    const header = signer.webhooks.generateTestHeaderString({ payload, secret: opts.webhookSecret });
    const event = { id: eventId };
    // The provider retries failed deliveries for days; a few quick tries are enough on loopback.
    for (let attempt = 0; attempt < 5; attempt++) {
      try {
        const res = await fetch(url, { method: 'POST', headers: { 'Content-Type': 'application/json', 'Stripe-Signature': header }, body: payload });
        state.webhooks.push({ id: event.id, type, at: new Date().toISOString(), status: res.status });
        save();
        if (res.ok) return;
      } catch (err) {
        state.webhooks.push({ id: event.id, type, at: new Date().toISOString(), status: (err as Error).message });
        save();
      }
      await new Promise((r) => setTimeout(r, 200 * 2 ** attempt));
    }
  }

  const app = express();
  const api = express.Router();
  api.use(express.urlencoded({ extended: true }));
  api.use((req, res, next) => {
    if (req.headers.authorization !== `Bearer ${opts.secretKey}`) return providerError(res, 401, 'Invalid API key provided');
    next();
  });

  api.post('/checkout/sessions', (req, res) => {
    const b = req.body as Record<string, unknown> & { line_items?: { price_data?: { currency?: string; unit_amount?: string; product_data?: { name?: string } }; quantity?: string }[]; metadata?: Record<string, string> };
    const items = b.line_items ?? [];
    if (!items.length) return providerError(res, 400, 'line_items is required', 'line_items');
    const currency = String(items[0].price_data?.currency ?? '').toLowerCase();
    if (!/^[a-z]{3}$/.test(currency)) return providerError(res, 400, 'A three-letter currency is required', 'line_items[0][price_data][currency]');
    let amount = 0;
    for (const item of items) {
      const unit = Number(item.price_data?.unit_amount);
      const qty = Number(item.quantity ?? 1);
      if (!Number.isInteger(unit) || unit < 1 || !Number.isInteger(qty) || qty < 1) return providerError(res, 400, 'unit_amount and quantity must be positive whole numbers', 'line_items');
      amount += unit * qty;
    }
    if (typeof b.success_url !== 'string') return providerError(res, 400, 'success_url is required', 'success_url');
    const id = newId('cs');
    const session: FakeSession = {
      id,
      object: 'checkout.session',
      amount_total: amount,
      currency,
      status: 'open',
      payment_status: 'unpaid',
      payment_intent: null,
      url: `${base}/checkout/${id}`,
      success_url: b.success_url,
      cancel_url: typeof b.cancel_url === 'string' ? b.cancel_url : null,
      client_reference_id: typeof b.client_reference_id === 'string' ? b.client_reference_id : null,
      customer_email: typeof b.customer_email === 'string' ? b.customer_email : null,
      metadata: b.metadata ?? {},
      description: items.map((i) => i.price_data?.product_data?.name ?? 'Payment').join(', '),
      created: now(),
      livemode: false,
    };
    state.sessions[id] = session;
    save();
    res.json(session);
  });

  api.get('/checkout/sessions/:id', (req, res) => {
    const s = state.sessions[req.params.id];
    if (!s) return providerError(res, 404, `No such checkout.session: '${req.params.id}'`, 'id');
    res.json(s);
  });

  api.post('/webhook_endpoints', (req, res) => {
    const b = req.body as { url?: string; enabled_events?: string[] };
    if (typeof b.url !== 'string' || !/^https?:\/\//.test(b.url)) return providerError(res, 400, 'url is required', 'url');
    const endpoint: FakeEndpoint = { id: newId('we'), object: 'webhook_endpoint', url: b.url, enabled_events: b.enabled_events?.length ? b.enabled_events : ['*'], status: 'enabled', created: now() };
    state.endpoints = { ...(state.endpoints ?? {}), [endpoint.id]: endpoint };
    save();
    res.json({ ...endpoint, secret: opts.webhookSecret });
  });

  api.delete('/webhook_endpoints/:id', (req, res) => {
    if (!state.endpoints?.[req.params.id]) return providerError(res, 404, `No such webhook endpoint: '${req.params.id}'`, 'id');
    delete state.endpoints[req.params.id];
    save();
    res.json({ id: req.params.id, object: 'webhook_endpoint', deleted: true });
  });

  api.post('/refunds', (req, res) => {
    const b = req.body as { payment_intent?: string; amount?: string; metadata?: Record<string, string> };
    const session = Object.values(state.sessions).find((s) => s.payment_intent && s.payment_intent === b.payment_intent);
    if (!session) return providerError(res, 400, `No such payment_intent: '${b.payment_intent}'`, 'payment_intent');
    const refunded = Object.values(state.refunds).filter((r) => r.payment_intent === session.payment_intent).reduce((a, r) => a + r.amount, 0);
    const amount = b.amount === undefined ? session.amount_total - refunded : Number(b.amount);
    if (!Number.isInteger(amount) || amount < 1 || amount > session.amount_total - refunded) {
      return providerError(res, 400, `Refund amount must be between 1 and ${session.amount_total - refunded}`, 'amount');
    }
    const refund: FakeRefund = { id: newId('re'), object: 'refund', amount, currency: session.currency, payment_intent: session.payment_intent!, status: 'succeeded', metadata: b.metadata ?? {}, created: now() };
    state.refunds[refund.id] = refund;
    save();
    res.json(refund);
  });

  app.use('/v1', api);

  app.get('/checkout/:id', (req, res) => {
    const s = state.sessions[req.params.id];
    if (!s) return res.status(404).type('text/plain').send('This checkout does not exist.');
    const amount = new Intl.NumberFormat('en', { style: 'currency', currency: s.currency.toUpperCase() }).format(s.amount_total / 100);
    const done = s.payment_status === 'paid';
    res.type('html').send(`<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>Checkout (local test payments)</title>
<style>body{font-family:system-ui,sans-serif;max-width:28rem;margin:3rem auto;padding:0 1rem;color:#1e1c19}main{border:1px solid #ddd8d1;border-radius:.5rem;padding:1.5rem}
.amount{font-size:2rem;font-weight:600;margin:.5rem 0 1rem}button{font:inherit;font-weight:600;background:#1f5a8f;color:#fff;border:0;border-radius:.375rem;padding:.75rem 1.5rem;min-height:44px;cursor:pointer}
p.note{font-size:.875rem;color:#57524c}</style></head><body><main>
<h1>Checkout</h1><p>${esc(s.description)}</p><p class="amount">${esc(amount)}</p>
${done ? '<p role="status">This checkout is paid.</p>' : `<form method="post" action="/checkout/${esc(s.id)}/pay"><button type="submit">Pay</button></form>`}
${s.cancel_url && !done ? `<p><a href="${esc(s.cancel_url)}">Cancel and go back</a></p>` : ''}
<p class="note">Local test payment service: no money moves.</p></main></body></html>`);
  });

  app.post('/checkout/:id/pay', async (req, res) => {
    const s = state.sessions[req.params.id];
    if (!s) return res.status(404).type('text/plain').send('This checkout does not exist.');
    if (s.payment_status !== 'paid') {
      s.payment_status = 'paid';
      s.status = 'complete';
      s.payment_intent = newId('pi');
      save();
      await sendWebhook('checkout.session.completed', s);
    }
    res.redirect(303, s.success_url.replace('{CHECKOUT_SESSION_ID}', s.id));
  });

  const server = await new Promise<http.Server>((resolve, reject) => {
    const srv = app.listen(opts.port, '127.0.0.1', () => resolve(srv));
    srv.on('error', reject);
  });
  return {
    url: base,
    state: () => state,
    stop: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}
