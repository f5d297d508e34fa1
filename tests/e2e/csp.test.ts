/**
 * The built app under its Content-Security-Policy: the sign-in page, the runs list and a
 * comparison chart load with no CSP violation reported in the browser console.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startBrowserHarness, visible, type BrowserHarness } from '../support/browser';
import type { TestShop } from '../support/test-app';

let h: BrowserHarness;
let s: TestShop;

beforeAll(async () => {
  h = await startBrowserHarness();
  s = await h.t.createShop('Csp Shop');
}, 120_000);
afterAll(() => h?.close());

describe('content security policy', () => {
  it('loads and runs the app with no CSP violation', async () => {
    const { page } = await h.newPage();
    const violations: string[] = [];
    page.on('console', (m) => {
      if (/Content Security Policy|Refused to (execute|load|apply|connect|frame)/i.test(m.text())) violations.push(m.text());
    });
    page.on('pageerror', (e) => violations.push(String(e)));
    const res = await page.goto(`${h.baseUrl}/login`);
    expect(res?.headers()['content-security-policy']).toContain("script-src 'self'");
    await page.getByLabel('E-mail').fill(s.users.owner.email);
    await page.getByLabel('Password').fill('correct-horse-battery');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL((u) => !u.pathname.startsWith('/login'));
    for (const p of ['/customers', '/finder', '/settings/outbox']) {
      await page.goto(`${h.baseUrl}${p}`);
      await page.waitForLoadState('networkidle');
    }
    await visible(page, /Send log/);
    expect(violations).toEqual([]);
  }, 120_000);
});
