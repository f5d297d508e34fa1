/**
 * Shop-floor usability in a real browser: every page names its tab (page · shop), dialogs open on
 * their first field, scroll boxes can be reached by keyboard, the reports list is in the
 * navigation, and a customer on a staff address is told plainly with a way home.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { startBrowserHarness, type BrowserHarness } from '../support/browser';
import { seedReportScenario } from '../support/report-fixtures';
import type { TestShop } from '../support/test-app';

// Invented shop name.
const SHOP = 'Kestrel Ridge Motorworks';

let h: BrowserHarness;
let shop: TestShop;
let shareUrl = '';

beforeAll(async () => {
  h = await startBrowserHarness();
  shop = await h.t.createShop(SHOP);
  const { comparisonId } = await seedReportScenario(h.t, shop);
  const desk = await h.t.signIn(shop.users.desk);
  const report = await desk.post('/api/reports').send({ comparisonId });
  expect(report.status).toBe(201);
  const share = await desk.post(`/api/reports/${report.body.id}/share`).send({ expiresInDays: 7 });
  expect(share.status).toBe(201);
  shareUrl = share.body.url;
}, 120_000);

afterAll(async () => {
  await h?.close();
});

async function titleOf(page: Page, path: string, expected: string) {
  await page.goto(`${h.baseUrl}${path}`);
  await expect.poll(() => page.title(), { timeout: 10_000 }).toBe(expected);
}

describe('shop-floor usability', () => {
  it('each page names the tab: page, then the shop (public pages: Pullbook or the report’s shop)', async () => {
    const { page, context } = await h.newPage();
    await titleOf(page, '/login', 'Sign in · Pullbook');
    await titleOf(page, '/forgot-password', 'Reset your password · Pullbook');
    await titleOf(page, new URL(shareUrl).pathname, `Gain report · ${SHOP}`);
    await context.close();

    const owner = await h.signInPage(shop.users.owner.email);
    await expect.poll(() => owner.title()).toBe(`Today · ${SHOP}`);
    for (const [path, name] of [
      ['/runs', 'Runs'],
      ['/customers', 'Customers'],
      ['/bikes', 'Bikes'],
      ['/comparisons', 'Comparisons'],
      ['/reports', 'Gain reports'],
      ['/finder', 'Build finder'],
      ['/settings/users', 'Users'],
      ['/account', 'My account'],
      ['/no-such-page', 'Not found'],
    ]) {
      await titleOf(owner, path, `${name} · ${SHOP}`);
    }
    await titleOf(owner, `/bikes/${shop.bike.id}`, `${shop.bike.year} ${shop.bike.make} ${shop.bike.model} · ${SHOP}`);
    await owner.context().close();
  });

  it('the reports list is in the navigation for staff', async () => {
    const desk = await h.signInPage(shop.users.desk.email);
    await desk.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Gain reports' }).click();
    await desk.waitForURL((u) => u.pathname === '/reports');
    await expect.poll(() => desk.getByRole('heading', { name: 'Gain reports', level: 1 }).isVisible()).toBe(true);
    await desk.context().close();

    const customer = await h.signInPage(shop.users.customer.email);
    await expect.poll(() => customer.getByRole('heading', { name: 'My bikes', level: 1 }).isVisible()).toBe(true);
    expect(await customer.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Gain reports' }).count()).toBe(0);
    await customer.context().close();
  });

  it('a dialog opens on its first field, and Enter at once does not close it unsaved', async () => {
    const desk = await h.signInPage(shop.users.desk.email);
    await desk.goto(`${h.baseUrl}/customers`);
    await desk.getByRole('button', { name: 'New customer' }).click();
    const dialog = desk.getByRole('dialog', { name: 'New customer' });
    await expect.poll(() => dialog.isVisible()).toBe(true);
    await expect.poll(() => dialog.getByLabel('Name').evaluate((el) => el === document.activeElement)).toBe(true);
    await h.screenshot(desk, 'shop-floor-01-dialog-focus');
    await desk.keyboard.press('Enter');
    await expect.poll(() => dialog.getByText('Name is required', { exact: true }).isVisible()).toBe(true);
    expect(await dialog.isVisible()).toBe(true);
    await desk.context().close();
  });

  it('scroll boxes of tables are named regions a keyboard can reach', async () => {
    const desk = await h.signInPage(shop.users.desk.email);
    await desk.goto(`${h.baseUrl}/comparisons`);
    const box = desk.getByRole('region', { name: 'Saved comparisons' });
    await expect.poll(() => box.isVisible()).toBe(true);
    expect(await box.getAttribute('tabindex')).toBe('0');
    await box.focus();
    expect(await box.evaluate((el) => el === document.activeElement)).toBe(true);
    await desk.context().close();
  });

  it('a customer on a staff address gets a plain page with the way home, not a retry', async () => {
    const customer = await h.signInPage(shop.users.customer.email);
    for (const path of ['/comparisons/new', '/runs', '/settings/dynos']) {
      await customer.goto(`${h.baseUrl}${path}`);
      const alert = customer.getByRole('alert').filter({ hasText: 'Not available for your role' });
      await expect.poll(() => alert.isVisible()).toBe(true);
      expect(await alert.textContent()).toContain('This page is for');
      expect(await customer.getByRole('button', { name: 'Try again' }).count()).toBe(0);
      expect(await alert.getByRole('link', { name: 'Go to the start page' }).isVisible()).toBe(true);
    }
    await h.screenshot(customer, 'shop-floor-02-customer-staff-page');
    await customer.getByRole('link', { name: 'Go to the start page' }).click();
    await customer.waitForURL((u) => u.pathname === '/');
    await expect.poll(() => customer.getByRole('heading', { name: 'My bikes', level: 1 }).isVisible()).toBe(true);
    await customer.context().close();
  });
});
