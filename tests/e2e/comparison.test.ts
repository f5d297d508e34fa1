/**
 * The comparison builder in a real browser: the tuner opens the builder for a bike, gets the
 * suggested stage-to-stage pair, adds a third run, hovers the overlay chart (the tooltip lists
 * every run at the cursor's rpm), saves the comparison and lands on its page. Then a 12-run
 * overlay is rendered and timed with performance marks (reported, not asserted: speed targets
 * live in the bench). Screenshots go to tests/artifacts/.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { chromium, type Page } from 'playwright-core';
import { startBrowserHarness, type BrowserHarness } from '../support/browser';
import type { TestShop } from '../support/test-app';
import { ComparisonFixtures, humpWithPeaks } from '../support/comparison-fixtures';
import type { Run } from '@server/modules/runs/run.entity';

// Same shim as foundation.test.ts: playwright-core refuses --user-data-dir in launch().
const launch = chromium.launch.bind(chromium);
chromium.launch = (options) => launch({ ...options, args: options?.args?.filter((a) => !a.startsWith('--user-data-dir=')) });

let h: BrowserHarness;
let shop: TestShop;
let runs: Run[] = [];

beforeAll(async () => {
  h = await startBrowserHarness();
  shop = await h.t.createShop('Larkspur Dyno Works');
  const em = h.t.deps.orm.em.fork();
  const f = new ComparisonFixtures(em, shop.shop);
  const dyno = f.dyno('Bay roller');
  const session = f.session(shop.bike, { dyno, ambientTempC: 22, baroKpa: 100.4, humidityPct: 35 });
  const stock = f.stage(shop.bike, 'Stock', 0);
  const pipe = f.stage(shop.bike, 'Pipe and tune', 1, [{ category: 'exhaust', description: 'Two-into-one pipe', partCostCents: 85_000, labourCostCents: 15_000 }]);
  const heads = f.stage(shop.bike, 'Ported heads', 2, [{ category: 'cylinder-heads', description: 'Mild port', partCostCents: 120_000, labourCostCents: 60_000 }]);
  const cond = { temperatureC: 22, baroKpa: 100.4, humidityPct: 35 };
  // Invented curves with the check-value peaks (common practice, no published source).
  const rStock = f.run(shop.bike, { curve: humpWithPeaks(96, 3000, 84), stage: stock, session, label: 'Stock pull 1', conditions: cond });
  f.run(shop.bike, { curve: humpWithPeaks(95.4, 3000, 83.4), stage: stock, session, label: 'Stock pull 2', conditions: cond });
  const rPipe = f.run(shop.bike, { curve: humpWithPeaks(109.1, 3200, 94.5), stage: pipe, session, label: 'Pipe pull 1', conditions: cond });
  const rHeads = f.run(shop.bike, { curve: humpWithPeaks(105, 3600, 101.3), stage: heads, session, label: 'Heads pull 1', conditions: cond });
  stock.referenceRun = rStock;
  pipe.referenceRun = rPipe;
  heads.referenceRun = rHeads;
  runs = [rStock, rPipe, rHeads];
  // Twelve more runs for the overlay timing.
  for (let i = 0; i < 9; i++) runs.push(f.run(shop.bike, { curve: humpWithPeaks(100 + i, 3100 + 50 * i, 90 + i), stage: null, session, label: `Timing pull ${i + 1}`, conditions: cond }));
  await em.flush();
}, 120_000);

afterAll(async () => {
  await h?.close();
});

async function hoverChart(page: Page, fraction: number) {
  const canvas = page.getByTestId('overlay-chart').locator('canvas').first();
  await canvas.scrollIntoViewIfNeeded();
  const box = await canvas.boundingBox();
  if (!box) throw new Error('overlay chart has no box');
  await canvas.hover({ position: { x: box.width * fraction - 10, y: box.height * 0.45 } });
  await canvas.hover({ position: { x: box.width * fraction, y: box.height * 0.45 } });
}

describe('comparison builder', () => {
  it('builds a comparison of three runs, shows the tooltip on hover and saves it', async () => {
    const page = await h.signInPage(shop.users.tuner.email);
    page.on('pageerror', (e) => console.log('[pageerror]', e.message, e.stack?.slice(0, 600)));
    page.on('console', (m) => m.type() === 'error' && console.log('[browser]', m.text().slice(0, 600)));
    await page.goto(`${h.baseUrl}/comparisons/new?bikeId=${shop.bike.id}`);
    // Suggested: previous stage's reference run (pipe) as baseline against the latest (heads).
    await expect.poll(() => page.getByLabel('Compare Pipe pull 1').isChecked()).toBe(true);
    expect(await page.getByLabel('Compare Heads pull 1').isChecked()).toBe(true);
    expect(await page.getByLabel('Use Pipe pull 1 as the baseline').isChecked()).toBe(true);
    await page.getByTestId('comparison-summary').waitFor();
    // The head-port check value: about +6.8 hp at peak (common practice, no published source).
    await expect.poll(() => page.getByTestId('comparison-summary').innerText()).toMatch(/\+6\.\d hp at peak/);

    // Third run, by keyboard: focus the checkbox and press space.
    await page.getByLabel('Compare Stock pull 1').focus();
    await page.keyboard.press('Space');
    await expect.poll(async () => (await page.getByTestId('comparison-summary').locator('li').count()) >= 2).toBe(true);
    await expect.poll(() => page.getByTestId('comparison-summary').innerText()).toMatch(/Stock pull 1 against Pipe pull 1/);

    await hoverChart(page, 0.6);
    const tip = page.getByTestId('overlay-tooltip');
    await tip.waitFor({ state: 'visible' });
    const tipText = await tip.innerText();
    for (const name of ['Stock pull 1', 'Pipe pull 1', 'Heads pull 1']) expect(tipText).toContain(name);
    expect(tipText).toMatch(/\d,\d{3} rpm/);
    await h.screenshot(page, 'comparison-builder-hover');

    // Save with a name.
    await page.getByRole('button', { name: 'Save comparison' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('Name').fill('Stock, pipe and heads');
    await dialog.getByRole('button', { name: 'Save' }).click();
    await page.waitForURL(/\/comparisons\/[0-9a-f-]{36}$/);
    await page.getByRole('heading', { name: 'Stock, pipe and heads' }).waitFor();
    await page.getByTestId('overlay-chart').locator('canvas').first().waitFor();
    const id = page.url().split('/').pop()!;
    const api = await h.t.signIn(shop.users.tuner);
    const saved = await api.get(`/api/comparisons/${id}`);
    expect(saved.body.comparison.runIds).toHaveLength(3);
    expect(saved.body.comparison.baselineRunId).toBe(runs[1].id);
    await h.screenshot(page, 'comparison-saved');

    // Tablet width.
    await page.setViewportSize({ width: 768, height: 1024 });
    await page.waitForTimeout(300);
    await h.screenshot(page, 'comparison-saved-768');
    await page.setViewportSize({ width: 1280, height: 800 });

    // From the saved comparison to the gain report.
    await page.getByLabel("Technician's note (optional)").fill('Check the exhaust clamps after 300 miles.');
    await page.getByRole('button', { name: 'Make gain report' }).click();
    await page.waitForURL(/\/reports\/[0-9a-f-]{36}$/, { timeout: 30_000 });
    await page.getByRole('heading', { name: /^Gain report R-\d{4}-\d{4}$/ }).waitFor();
    await page.getByRole('button', { name: 'Send to customer' }).waitFor();
    const reportId = page.url().split('/').pop()!;
    const report = await api.get(`/api/reports/${reportId}`);
    expect(report.body.comparisonId).toBe(id);
    expect(report.body.technicianNote).toBe('Check the exhaust clamps after 300 miles.');
    await h.screenshot(page, 'comparison-gain-report');

    // A bad recipient is flagged next to the field before anything is sent.
    await page.getByRole('button', { name: 'Send to customer' }).click();
    const send = page.getByRole('dialog');
    await send.getByLabel('To').fill('not-an-address');
    await send.getByRole('button', { name: 'Send report' }).click();
    const to = send.getByLabel('To');
    await expect.poll(() => to.getAttribute('aria-invalid')).toBe('true');
    const described = (await to.getAttribute('aria-describedby')) ?? '';
    const texts = await Promise.all(described.split(/\s+/).filter(Boolean).map((d) => page.locator(`[id="${d}"]`).innerText().catch(() => '')));
    expect(texts.join(' ')).toContain('Enter a valid e-mail address');
    await h.screenshot(page, 'comparison-send-invalid');
    await page.context().close();
  }, 90_000);

  it('renders a 12-run overlay and reports its render time (performance marks)', async () => {
    const page = await h.signInPage(shop.users.tuner.email);
    const twelve = runs.slice(0, 12).map((r) => r.id);
    expect(twelve).toHaveLength(12);
    await page.goto(`${h.baseUrl}/comparisons/new?runIds=${twelve.join(',')}&baselineRunId=${twelve[0]}`);
    await page.getByTestId('overlay-chart').locator('canvas').first().waitFor();
    await expect.poll(() => page.evaluate(() => performance.getEntriesByName('pb:overlay-render').length), { timeout: 15_000 }).toBeGreaterThan(0);
    const ms = await page.evaluate(() => performance.getEntriesByName('pb:overlay-render')[0].duration);
    console.log(`[e2e] 12-run overlay: option built → first frame finished in ${ms.toFixed(1)} ms`);
    expect(ms).toBeGreaterThan(0);
    await hoverChart(page, 0.5);
    await page.getByTestId('overlay-tooltip').waitFor({ state: 'visible' });
    expect((await page.getByTestId('overlay-tooltip').locator('tbody tr').count())).toBe(12);
    await h.screenshot(page, 'comparison-12-runs');
    await page.context().close();
  }, 90_000);
});
