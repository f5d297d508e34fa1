/**
 * Sending a gain report from its page: the share link the e-mail carries shows in the report's
 * share panel straight away (listed, and the link itself to copy), without a reload.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startBrowserHarness, type BrowserHarness } from '../support/browser';
import { latestMailTo } from '../support/mail';
import { seedReportScenario } from '../support/report-fixtures';
import type { TestShop } from '../support/test-app';

let h: BrowserHarness;
let shop: TestShop;
let reportId = '';

beforeAll(async () => {
  h = await startBrowserHarness();
  shop = await h.t.createShop('Quarry Road Moto');
  const scenario = await seedReportScenario(h.t, shop);
  const desk = await h.t.signIn(shop.users.desk);
  const res = await desk.post('/api/reports').send({ comparisonId: scenario.comparisonId });
  if (res.status !== 201) throw new Error(`making the report failed: ${res.status}`);
  reportId = res.body.id as string;
}, 120_000);

afterAll(async () => {
  await h?.close();
});

describe('sending a report', () => {
  it('lists the new share link in the share panel and shows the link that was e-mailed', async () => {
    const page = await h.signInPage(shop.users.desk.email);
    await page.goto(`${h.baseUrl}/reports/${reportId}`);
    await expect.poll(() => page.getByText('No share links yet').isVisible(), { timeout: 10_000 }).toBe(true);
    await page.getByRole('button', { name: 'Send to customer' }).click();
    const dialog = page.getByRole('dialog');
    const to = 'rider.inbox@example.test';
    await dialog.getByLabel('To').fill(to);
    await dialog.getByRole('button', { name: 'Send report' }).click();
    await expect.poll(() => dialog.isVisible()).toBe(false);
    const mail = await latestMailTo(to, 10_000);
    const url = /https?:\/\/\S+\/share\/\S+/.exec(mail.text)?.[0];
    expect(url).toBeTruthy();
    const links = page.getByRole('region', { name: 'Share links' });
    await expect.poll(() => links.locator('tbody tr').count(), { timeout: 5000 }).toBe(1);
    expect(await links.locator('tbody tr').first().textContent()).toContain('active');
    await expect.poll(() => page.getByLabel('New share link').inputValue(), { timeout: 5000 }).toBe(url);
  }, 90_000);
});
