/**
 * Browser tests: the real app (built client + API on a database of its own) on a free loopback
 * port, driven by playwright-core with Debian's Chromium. Screenshots go to tests/artifacts/.
 */
import http from 'node:http';
import fs from 'node:fs';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { expect } from 'vitest';
import { createTestApp, TEST_PASSWORD, type TestApp } from './test-app';

export const ARTIFACTS = path.resolve('tests/artifacts');

export interface BrowserHarness {
  t: TestApp;
  baseUrl: string;
  browser: Browser;
  /** A fresh context (own cookies), with a page. */
  newPage(): Promise<{ context: BrowserContext; page: Page }>;
  signInPage(email: string, password?: string): Promise<Page>;
  screenshot(page: Page, name: string): Promise<string>;
  close(): Promise<void>;
}

export async function startBrowserHarness(): Promise<BrowserHarness> {
  const clientDir = process.env.PULLBOOK_CLIENT_DIR;
  if (!clientDir || !fs.existsSync(path.join(clientDir, 'index.html'))) throw new Error('PULLBOOK_CLIENT_DIR has no built client: run browser tests through `npm test`');
  // PUBLIC_URL must be the address the browser uses, for the same-origin check and e-mailed links.
  const server = http.createServer();
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  const port = (server.address() as AddressInfo).port;
  const baseUrl = `http://127.0.0.1:${port}`;
  const t = await createTestApp({ clientDir, env: { PUBLIC_URL: baseUrl } });
  server.on('request', t.app);

  // playwright-core gives each launch a fresh temporary profile (it refuses --user-data-dir here).
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  fs.mkdirSync(ARTIFACTS, { recursive: true });

  const harness: BrowserHarness = {
    t,
    baseUrl,
    browser,
    async newPage() {
      const context = await browser.newContext({ viewport: { width: 1280, height: 800 }, acceptDownloads: true });
      const page = await context.newPage();
      page.setDefaultTimeout(15_000);
      return { context, page };
    },
    async signInPage(email, password = TEST_PASSWORD) {
      const { page } = await harness.newPage();
      await page.goto(`${baseUrl}/login`);
      await page.getByLabel('E-mail').fill(email);
      await page.getByLabel('Password').fill(password);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.waitForURL((u) => !u.pathname.startsWith('/login'));
      return page;
    },
    async screenshot(page, name) {
      const file = path.join(ARTIFACTS, `${name}.png`);
      await page.screenshot({ path: file, fullPage: true });
      return file;
    },
    async close() {
      await browser.close();
      await new Promise<void>((r) => server.close(() => r()));
      server.closeAllConnections();
      await t.close();
    },
  };
  return harness;
}

/** Waits (up to 15 s) until some element with this text is visible. */
export async function visible(page: Page, text: string | RegExp) {
  await expect.poll(() => page.getByText(text).first().isVisible(), { timeout: 15_000 }).toBe(true);
}
