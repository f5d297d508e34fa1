/**
 * The password strength meter in a real browser: it appears under the new-password field on the
 * account page once the (lazily loaded) policy has judged what was typed, and follows the typing.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startBrowserHarness, type BrowserHarness } from '../support/browser';
import type { TestShop } from '../support/test-app';

let h: BrowserHarness;
let shop: TestShop;

beforeAll(async () => {
  h = await startBrowserHarness();
  shop = await h.t.createShop('Meter Motor Works');
}, 120_000);

afterAll(async () => {
  await h?.close();
});

describe('password strength meter', () => {
  it('judges the new password as it is typed on the account page', async () => {
    const page = await h.signInPage(shop.users.desk.email);
    await page.goto(`${h.baseUrl}/account`);
    const meter = page.getByTestId('password-meter');
    const field = page.getByLabel('New password');
    // "qwertyuiop" is on the common-password list (NIST SP 800-63B §5.1.1.2), zxcvbn score 0.
    await field.fill('qwertyuiop');
    await expect.poll(() => meter.textContent(), { timeout: 10_000 }).toContain('Strength: Very weak');
    expect(await meter.textContent()).toContain('commonly used');
    await field.fill('gravel-lantern-orchid-42');
    await expect.poll(() => meter.textContent(), { timeout: 10_000 }).toContain('Strength: Very strong');
    await h.screenshot(page, 'password-meter-strong');
    await field.fill('');
    await expect.poll(() => meter.textContent()).toBe('');
  });
});
