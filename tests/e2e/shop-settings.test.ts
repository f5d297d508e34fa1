/**
 * The owner's shop settings in a real browser: the time zone is chosen from the runtime's list of
 * IANA zones and the fixed deposit is typed as money (250.00), kept by the API in cents.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startBrowserHarness, type BrowserHarness } from '../support/browser';
import type { TestShop } from '../support/test-app';

let h: BrowserHarness;
let shop: TestShop;

beforeAll(async () => {
  h = await startBrowserHarness();
  shop = await h.t.createShop('Zone Motor Works');
}, 120_000);

afterAll(async () => {
  await h?.close();
});

describe('shop settings', () => {
  it('saves the time zone and a fixed deposit typed as money', async () => {
    const page = await h.signInPage(shop.users.owner.email);
    await page.goto(`${h.baseUrl}/settings/shop`);
    const zone = page.getByLabel('Time zone');
    await expect.poll(() => zone.isVisible()).toBe(true);
    expect(await zone.inputValue()).toBe('UTC');
    await zone.selectOption('America/Denver');
    await expect.poll(() => page.getByText(/there\.$/).first().textContent()).toMatch(/Now .* there\./);
    await page.getByLabel('Deposit', { exact: true }).selectOption('fixed');
    const fixed = page.getByLabel('Fixed deposit');
    await fixed.fill('250.005');
    await page.getByRole('button', { name: 'Save settings' }).click();
    await expect.poll(() => page.getByText('At most two decimals').first().isVisible()).toBe(true);
    await fixed.fill('250.50');
    const save = page.getByRole('button', { name: 'Save settings' });
    await save.click();
    const toast = page.getByRole('listitem').filter({ hasText: 'Shop settings saved' });
    await expect.poll(() => toast.isVisible()).toBe(true);
    // The toast never covers the button just pressed (bottom right of the form).
    const [a, b] = [(await toast.boundingBox())!, (await save.boundingBox())!];
    const overlaps = a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;
    expect(overlaps, `toast ${JSON.stringify(a)} over Save ${JSON.stringify(b)}`).toBe(false);
    await h.screenshot(page, 'shop-settings-zone-deposit');

    const owner = await h.t.signIn(shop.users.owner);
    const saved = (await owner.get('/api/shop')).body;
    expect(saved).toMatchObject({ timeZone: 'America/Denver', depositMode: 'fixed', depositFixedCents: 25050 });
    // Reloaded, the form shows the amount as money again.
    await page.reload();
    await expect.poll(() => page.getByLabel('Fixed deposit').inputValue()).toBe('250.5');
  });
});
