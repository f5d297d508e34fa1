/**
 * Pictures where people look, on the invented demo archive: the bike page's gains by stage, the
 * build finder's scatter and box plot, and the report's difference-from-baseline chart beside the
 * absolute curves. Screenshots go to tests/artifacts/ux-<phase>-*.png (UX_SHOTS=before names the
 * set taken on the code before the charts).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fs from 'node:fs';
import path from 'node:path';
import { ARTIFACTS, startBrowserHarness, visible, type BrowserHarness } from '../support/browser';
import { DEMO_PASSWORD, seedDemoIfEmpty, type DemoIds } from '@server/db/demo-seed';
import '@server/db/demo-archive';

const PHASE = process.env.UX_SHOTS === 'before' ? 'before' : 'after';

let h: BrowserHarness;
let ids: DemoIds;

beforeAll(async () => {
  h = await startBrowserHarness();
  ids = (await seedDemoIfEmpty(h.t.deps))!;
  expect(ids).toBeTruthy();
}, 240_000);
afterAll(() => h?.close());

describe('pictures on the demo archive', () => {
  it('bike page: gains by stage', async () => {
    const page = await h.signInPage('owner@demo.pullbook.test', DEMO_PASSWORD);
    await page.goto(`${h.baseUrl}/bikes/${ids.bikes[0].id}`);
    await visible(page, 'Gains by stage');
    await page.getByRole('region', { name: /gains and cost per hp/i }).first().waitFor();
    if (PHASE === 'after') {
      const chart = page.getByRole('img', { name: /gain of each stage/i });
      await expect.poll(() => chart.isVisible()).toBe(true);
    }
    await page.waitForTimeout(800);
    await h.screenshot(page, `ux-${PHASE}-bike-page`);
    await page.setViewportSize({ width: 768, height: 1024 });
    await page.waitForTimeout(500);
    await h.screenshot(page, `ux-${PHASE}-bike-page-768`);
    await page.context().close();
  });

  it('build finder: gain against cost, gains by part category, the table below', async () => {
    const page = await h.signInPage('owner@demo.pullbook.test', DEMO_PASSWORD);
    await page.goto(`${h.baseUrl}/finder`);
    await page.getByRole('region', { name: 'Matching builds' }).waitFor();
    if (PHASE === 'after') {
      await expect.poll(() => page.getByRole('img', { name: /peak power gain against build cost/i }).isVisible()).toBe(true);
      await expect.poll(() => page.getByRole('img', { name: /gains by part category/i }).isVisible()).toBe(true);
    }
    await page.waitForTimeout(800);
    await h.screenshot(page, `ux-${PHASE}-finder`);
    await page.setViewportSize({ width: 768, height: 1024 });
    await page.waitForTimeout(500);
    await h.screenshot(page, `ux-${PHASE}-finder-768`);
    await page.context().close();
  });

  it('report page: the difference from the baseline beside the absolute curves', async () => {
    const page = await h.signInPage('customer@demo.pullbook.test', DEMO_PASSWORD);
    const reports = await page.request.get(`${h.baseUrl}/api/reports`);
    const items = ((await reports.json()) as { items: { id: string }[] }).items;
    expect(items.length).toBeGreaterThan(0);
    await page.goto(`${h.baseUrl}/reports/${items[0].id}`);
    await visible(page, 'Chart');
    if (PHASE === 'after') {
      await expect.poll(() => page.getByRole('img', { name: /difference from the baseline/i }).isVisible()).toBe(true);
    }
    await page.waitForTimeout(800);
    await h.screenshot(page, `ux-${PHASE}-report`);
    // The PDF the customer keeps, for a look at its charts (pdftoppm turns it into pictures).
    const pdf = await page.request.get(`${h.baseUrl}/api/reports/${items[0].id}/pdf`);
    expect(pdf.status()).toBe(200);
    fs.writeFileSync(path.join(ARTIFACTS, `ux-${PHASE}-report.pdf`), await pdf.body());
    await page.context().close();
  });
});
