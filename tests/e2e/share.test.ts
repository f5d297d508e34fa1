import http from 'node:http';
import fs from 'node:fs';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { chromium, type Browser, type Page } from 'playwright-core';
import { ARTIFACTS } from '../support/browser';
import { REFERENCE_AIR, seedReportScenario } from '../support/report-fixtures';
import { ComparisonFixtures, humpWithPeaks } from '../support/comparison-fixtures';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';

/**
 * The app on a free loopback port and Debian's Chromium. Same set-up as tests/support/browser.ts,
 * except that playwright-core 1.65 refuses a `--user-data-dir` launch argument, so none is passed
 * (each new context is already a fresh profile without cookies).
 */
async function startHarness() {
  const clientDir = process.env.PULLBOOK_CLIENT_DIR;
  if (!clientDir || !fs.existsSync(path.join(clientDir, 'index.html'))) throw new Error('PULLBOOK_CLIENT_DIR has no built client: run browser tests through `npm test`');
  const server = http.createServer();
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  const baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const t: TestApp = await createTestApp({ clientDir, env: { PUBLIC_URL: baseUrl } });
  server.on('request', t.app);
  const browser: Browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  fs.mkdirSync(ARTIFACTS, { recursive: true });
  return {
    t,
    baseUrl,
    async newPage() {
      const context = await browser.newContext({ viewport: { width: 1280, height: 800 }, acceptDownloads: true });
      const page = await context.newPage();
      page.setDefaultTimeout(15_000);
      return { context, page };
    },
    async screenshot(page: Page, name: string) {
      await page.screenshot({ path: path.join(ARTIFACTS, `${name}.png`), fullPage: true });
    },
    async close() {
      await browser.close();
      await new Promise<void>((r) => server.close(() => r()));
      server.closeAllConnections();
      await t.close();
    },
  };
}

let h: Awaited<ReturnType<typeof startHarness>>;
let s: TestShop;
let shareUrl: string;
let warnedShareUrl: string;
let pdfSha: string;

beforeAll(async () => {
  h = await startHarness();
  s = await h.t.createShop('Share Page Garage');
  const { comparisonId } = await seedReportScenario(h.t, s);
  const desk = await h.t.signIn(s.users.desk);
  const report = await desk.post('/api/reports').send({ comparisonId });
  expect(report.status).toBe(201);
  pdfSha = (await desk.get(`/api/reports/${report.body.id}`)).body.pdfSha256;
  const share = await desk.post(`/api/reports/${report.body.id}/share`).send({ expiresInDays: 7 });
  expect(share.status).toBe(201);
  shareUrl = share.body.url;

  // A second report whose runs were made 15 °C apart (the fairness rule is 10 °C): it carries a warning.
  const w = await h.t.createShop('Hot Bay Garage');
  const seeded = await seedReportScenario(h.t, w);
  const fx = new ComparisonFixtures(h.t.deps.orm.em.fork(), w.shop);
  const hot = fx.session(w.bike, { dyno: null, ambientTempC: 40, baroKpa: 99, humidityPct: 0 });
  const hotRun = fx.run(w.bike, { session: hot, conditions: { ...REFERENCE_AIR, temperatureC: 40 }, correctionStandard: 'sae-j1349', correctionFactor: 1, label: 'Hot afternoon pull', curve: humpWithPeaks(108, 3700, 103.5) });
  await fx.flush();
  const wDesk = await h.t.signIn(w.users.desk);
  const cmp = await wDesk.post('/api/comparisons').send({ name: 'Hot afternoon against baseline', runIds: [seeded.runs.r0.id, hotRun.id], baselineRunId: seeded.runs.r0.id, options: {} });
  expect(cmp.status).toBe(201);
  const wReport = await wDesk.post('/api/reports').send({ comparisonId: cmp.body.id });
  expect(wReport.status).toBe(201);
  const wShare = await wDesk.post(`/api/reports/${wReport.body.id}/share`).send({ expiresInDays: 7 });
  expect(wShare.status).toBe(201);
  warnedShareUrl = wShare.body.url;
}, 90_000);
afterAll(() => h?.close());

describe('public share page', () => {
  it('shows the summary, chart and PDF link to someone who is not signed in', async () => {
    const { context, page } = await h.newPage();
    try {
      expect(shareUrl.startsWith(h.baseUrl)).toBe(true);
      await page.goto(shareUrl);
      await page.getByRole('heading', { level: 1, name: /Gain report/ }).waitFor();
      await expect(page.getByText('Share Page Garage').first().isVisible()).resolves.toBe(true);
      await expect(page.getByText('+18.5 hp').first().isVisible()).resolves.toBe(true);
      await page.locator('canvas').first().waitFor();
      const link = page.getByRole('link', { name: 'Download the PDF' });
      const href = await link.getAttribute('href');
      expect(href).toMatch(/^\/api\/share\/[A-Za-z0-9_-]{43}\/pdf$/);
      // The same context (no session cookie) can download it, and it is the stored PDF.
      const res = await context.request.get(`${h.baseUrl}${href}`);
      expect(res.status()).toBe(200);
      expect(res.headers()['content-type']).toMatch(/^application\/pdf/);
      const { createHash } = await import('node:crypto');
      expect(createHash('sha256').update(await res.body()).digest('hex')).toBe(pdfSha);
      // No sign-in form and no app navigation: the page stands alone.
      expect(await page.getByLabel('Password').count()).toBe(0);
      await h.screenshot(page, 'share-page');
      await page.setViewportSize({ width: 768, height: 1024 });
      await h.screenshot(page, 'share-page-768');
    } finally {
      await context.close();
    }
  });

  it('shows the report’s warnings in words, not only the hint that there are some', async () => {
    const { context, page } = await h.newPage();
    try {
      await page.goto(warnedShareUrl);
      await page.getByRole('heading', { level: 1, name: /Gain report/ }).waitFor();
      const list = page.getByRole('list', { name: 'Warnings about these figures' });
      await list.waitFor();
      const items = await list.getByRole('listitem').allInnerTexts();
      expect(items.length).toBeGreaterThan(0);
      expect(items.join(' ')).toMatch(/°C/);
      await h.screenshot(page, 'share-page-warnings');
    } finally {
      await context.close();
    }
  });

  it('shows a friendly page for a link that is not valid', async () => {
    const { context, page } = await h.newPage();
    try {
      await page.goto(`${h.baseUrl}/share/${'Z'.repeat(43)}`);
      await page.getByRole('heading', { name: 'This link is not valid' }).waitFor();
      await h.screenshot(page, 'share-page-invalid');
    } finally {
      await context.close();
    }
  });
});
