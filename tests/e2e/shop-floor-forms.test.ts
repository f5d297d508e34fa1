/**
 * Shop-floor form fixes in a real browser: a bike size typed in the wrong unit is read sensibly
 * instead of refused, and a tagged run's stage shows in its edit form once the stage list arrives.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startBrowserHarness, type BrowserHarness } from '../support/browser';
import type { TestShop } from '../support/test-app';
import { ComparisonFixtures, humpWithPeaks } from '../support/comparison-fixtures';

let h: BrowserHarness;
let shop: TestShop;
let taggedRunId = '';
let tagId = '';

beforeAll(async () => {
  h = await startBrowserHarness();
  shop = await h.t.createShop('Larkspur Cycle Bay'); // imperial by default
  const em = h.t.deps.orm.em.fork();
  const f = new ComparisonFixtures(em, shop.shop);
  const session = f.session(shop.bike, { ambientTempC: 22, baroKpa: 100.4, humidityPct: 35 });
  f.stage(shop.bike, 'Stock', 0);
  const pipe = f.stage(shop.bike, 'Pipe and tune', 1);
  // An invented curve (common practice, no published source).
  const run = f.run(shop.bike, { curve: humpWithPeaks(100, 3200, 90), stage: pipe, session, label: 'Pipe pull 1', conditions: { temperatureC: 22, baroKpa: 100.4, humidityPct: 35 } });
  await em.flush();
  taggedRunId = run.id;
  tagId = pipe.id;
}, 120_000);

afterAll(async () => {
  await h?.close();
});

describe('bike form in an imperial shop', () => {
  it('reads "1746" typed as cubic inches as cm³, shows the conversion and saves it', async () => {
    const page = await h.signInPage(shop.users.desk.email);
    await expect.poll(() => page.getByRole('heading', { name: 'Today', level: 1 }).isVisible()).toBe(true);
    // Opened from the start page, as the desk does, once the shop's settings are in.
    await page.getByRole('link', { name: 'New bike' }).click();
    const dialog = page.getByRole('dialog', { name: 'New bike' });
    await expect.poll(() => dialog.isVisible()).toBe(true);
    await expect.poll(() => dialog.getByLabel('Owner').locator('option').allTextContents()).toContain(shop.customer.name);
    await dialog.getByLabel('Owner').selectOption({ label: shop.customer.name });
    // The imperial shop's new bikes start in cubic inches.
    await expect.poll(() => dialog.getByLabel('cubic inches').isChecked()).toBe(true);
    await dialog.getByLabel('Make').fill('Corvale');
    await dialog.getByLabel('Model').fill('Tourer 1746');
    await dialog.getByLabel('Displacement').fill('1746');
    // 1746 cm³ ÷ 16.387064 cm³/in³ (exact, NIST SP 811) = 106.5 in³.
    await expect.poll(() => dialog.getByText('Read as cm³ (too large for cubic inches): = 1,746 cm³ = 106.5 in³').isVisible()).toBe(true);
    expect(await dialog.getByLabel('cm³ (cc)').isChecked()).toBe(true);
    await dialog.getByRole('button', { name: 'Add bike' }).click();
    await page.waitForURL(/\/bikes\/[0-9a-f-]{36}$/);
    const details = page.getByRole('region', { name: 'Bike details' });
    await expect.poll(() => details.isVisible()).toBe(true);
    const text = (await details.textContent()) ?? '';
    expect(text).toContain('1,746 cm³');
    expect(text).toContain('106.5 in³');
  });
});

describe('run page', () => {
  it('shows the run’s stage in the edit form once the (slower) stage list has arrived', async () => {
    const page = await h.signInPage(shop.users.tuner.email);
    // The stage list answers after the run, as on a slow shop connection.
    await page.route('**/api/stages?**', async (route) => {
      await new Promise((r) => setTimeout(r, 1200));
      await route.continue();
    });
    const stagesArrived = page.waitForResponse((r) => r.url().includes('/api/stages?'));
    await page.goto(`${h.baseUrl}/runs/${taggedRunId}`);
    await stagesArrived;
    const select = page.getByRole('form', { name: 'Edit run' }).getByLabel('Stage');
    // Both stages listed: the list is in, and the run's own stage is the one selected.
    await expect.poll(() => select.locator('option').allTextContents(), { timeout: 5000 }).toContain('Stock');
    await expect.poll(() => select.inputValue(), { timeout: 3000 }).toBe(tagId);
    expect(await select.locator('option:checked').textContent()).toBe('Pipe and tune');
  });
});
