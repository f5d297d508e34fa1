/**
 * A build plan end to end in the browser: staff draft it on the bike page and send it; the
 * customer opens the e-mailed link, accepts with a typed name and pays the deposit on the local
 * payment service's checkout page ("Pay"); the provider's signed webhook marks it paid, and the
 * staff page shows the deposit.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import { AxeBuilder } from '@axe-core/playwright';
import type { Page } from 'playwright-core';
import { startBrowserHarness, visible, type BrowserHarness } from '../support/browser';
import { latestMailTo } from '../support/mail';
import type { TestShop } from '../support/test-app';
import { addArchiveBike, straightCurve } from '../support/plan-fixtures';
import { Bike } from '@server/modules/bikes/bike.entity';
import { Customer } from '@server/modules/customers/customer.entity';
import { Run } from '@server/modules/runs/run.entity';
import { Shop } from '@server/modules/shops/shop.entity';
import { Stage } from '@server/modules/stages/stage.entity';

let h: BrowserHarness;
let shop: TestShop;
let stripe: Stripe;
let endpointId = '';

beforeAll(async () => {
  h = await startBrowserHarness();
  shop = await h.t.createShop('Kiln Lane Motors');
  const owner = await h.t.signIn(shop.users.owner);
  const res = await owner.put('/api/shop').send({ name: 'Kiln Lane Motors', units: 'imperial', paperSize: 'letter', defaultCorrection: 'sae-j1349', depositMode: 'percent', depositPercent: 20 });
  if (res.status !== 200) throw new Error(`shop settings: ${res.status} ${JSON.stringify(res.body)}`);
  // Five similar builds that added an exhaust, and the bike's own baseline run (the band is drawn over it).
  const em = h.t.deps.orm.em.fork();
  const other = em.create(Customer, { shop: em.getReference(Shop, shop.shop.id), name: 'Archive Rider' } as Customer);
  for (const [i, g] of [5, 7, 6, 8, 4].entries()) {
    const b = await addArchiveBike(em, shop.shop.id, other, 1620 + i * 10, [{ peak: g, parts: [{ category: 'exhaust', cost: 80_000 }] }]);
    b.engineFamily = 'TM-100';
  }
  const mine = await em.findOneOrFail(Bike, shop.bike.id);
  const base = em.create(Stage, { shop: em.getReference(Shop, shop.shop.id), bike: mine, position: 0, name: 'Baseline' } as Stage);
  base.referenceRun = em.create(Run, { shop: base.shop, bike: mine, stage: base, sequence: 1, rawKey: 'k/e2e-plan', rawSha256: 'b'.repeat(64), rawSizeBytes: 10, originalName: 'base.csv', status: 'ready', warnings: [], tags: [], curve: straightCurve(0), correctionFactor: 1, peakPowerHp: 100 } as unknown as Run);
  await em.flush();
  // The app on its port is this test's webhook endpoint at the payment service, as a deployment registers one.
  const url = new URL(process.env.PAYMENTS_API_URL!);
  stripe = new Stripe(process.env.PAYMENTS_SECRET_KEY!, { host: url.hostname, port: Number(url.port), protocol: 'http', maxNetworkRetries: 0 });
  endpointId = (await stripe.webhookEndpoints.create({ url: `${h.baseUrl}/api/payments/webhook`, enabled_events: ['checkout.session.completed'] })).id;
}, 120_000);

afterAll(async () => {
  if (endpointId) await stripe.webhookEndpoints.del(endpointId).catch(() => undefined);
  await h?.close();
});

/** WCAG 2 A/AA problems axe finds in the page's main content (serious and critical ones). */
async function axeProblems(page: Page) {
  const result = await new AxeBuilder({ page }).include('main').withTags(['wcag2a', 'wcag2aa']).analyze();
  return result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
}

describe('build plan', () => {
  it('is drafted and sent by staff, accepted and paid by the customer, and the deposit shows on the staff page', async () => {
    const staff = await h.signInPage(shop.users.desk.email);
    await staff.goto(`${h.baseUrl}/bikes/${shop.bike.id}`);
    await visible(staff, 'Build plans');
    await staff.getByRole('button', { name: 'New plan' }).click();
    const dialog = staff.getByRole('dialog');
    await dialog.getByLabel('Title').fill('Slip-ons and tune');
    const item = dialog.getByRole('group', { name: 'Item 1' });
    await item.getByLabel('Description').fill('Slip-on mufflers and a dyno tune');
    await item.getByLabel('Parts').fill('900');
    await item.getByLabel('Labour').fill('350.50');
    await dialog.getByRole('button', { name: 'Draft plan' }).click();
    await staff.waitForURL(/\/plans\/[0-9a-f-]{36}$/);
    const planUrl = staff.url();
    await visible(staff, '$1,250.50');
    await visible(staff, '5 similar builds had exhaust measured');
    await expect.poll(() => staff.getByRole('img', { name: /^Chart: Baseline reference run with the expected gain/ }).isVisible()).toBe(true);
    await staff.getByRole('button', { name: 'Send to the customer' }).click();
    await visible(staff, 'Sent, awaiting answer');
    await h.screenshot(staff, 'plan-staff-sent');
    expect(await axeProblems(staff)).toEqual([]);

    const mail = await latestMailTo(shop.customer.email!, 10_000);
    expect(mail.attachments.map((a) => a.contentType)).toContain('application/pdf');
    const link = /https?:\/\/\S+\/plan\/[A-Za-z0-9_-]{43}/.exec(mail.text)?.[0];
    expect(link).toBeTruthy();

    const { page: customer } = await h.newPage();
    await customer.goto(link!);
    await visible(customer, 'Slip-ons and tune');
    await visible(customer, /not a promise/);
    expect(await axeProblems(customer)).toEqual([]);
    await customer.getByLabel('Type your full name to accept').fill('Sam Ridgeway');
    await customer.getByRole('button', { name: 'Accept the plan' }).click();
    await visible(customer, 'Thank you, Sam Ridgeway.');
    await customer.getByRole('button', { name: 'Pay the deposit' }).click();
    await customer.waitForURL(/\/checkout\/cs_test_/);
    await visible(customer, '$250.10'); // 20 % of $1,250.50 = $250.10
    await h.screenshot(customer, 'plan-checkout');
    await customer.getByRole('button', { name: 'Pay' }).click();
    await customer.waitForURL(/\/plan\/[A-Za-z0-9_-]{43}\?deposit=paid/);
    await visible(customer, 'Deposit paid: $250.10');
    await h.screenshot(customer, 'plan-customer-paid');

    await staff.goto(planUrl);
    await visible(staff, 'Accepted');
    await visible(staff, /\$250\.10 asked · \$250\.10 paid/);
    await visible(staff, /by Sam Ridgeway/);
    await h.screenshot(staff, 'plan-staff-deposit');
    await staff.goto(`${h.baseUrl}/bikes/${shop.bike.id}`);
    await visible(staff, /deposit \$250\.10 of \$250\.10 paid/);
  }, 180_000);
});
