/**
 * Forty files at once, in a real browser: the results are a compact grid with a status icon per
 * file, the "n of 40 done" counter stays on screen while the page scrolls, a file that could not be
 * read gets "Read again", leaving mid-upload asks first, and the batch stays listed on the session
 * page after the upload page is left. Screenshot: tests/artifacts/ux-<UX_SHOT or after>-upload-results.png.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SAFETY_CHECKS } from '@shared/schemas/run';
import { startBrowserHarness, visible, type BrowserHarness } from '../support/browser';
import { syntheticRunFile } from '@server/db/synthetic-runs';
import type { TestShop } from '../support/test-app';

let h: BrowserHarness;
let shop: TestShop;
let dir: string;
let sessionId = '';
const files: string[] = [];
const COUNT = 40;
const BROKEN = 'pull-13-broken.csv';

beforeAll(async () => {
  // A temp folder of this file's own: other test runs on the machine clean the shared default.
  process.env.UPLOAD_TMP_DIR = fs.mkdtempSync(path.join(os.tmpdir(), 'pb-grid-tmp-'));
  h = await startBrowserHarness();
  shop = await h.t.createShop('Gravelpit Cycle Works');
  const owner = await h.t.signIn(shop.users.owner);
  expect((await owner.post('/api/stages').send({ bikeId: shop.bike.id, name: 'Baseline' })).status).toBe(201);
  const session = await owner.post('/api/sessions').send({ bikeId: shop.bike.id });
  expect(session.status).toBe(201);
  sessionId = session.body.id;
  expect((await owner.post(`/api/sessions/${sessionId}/safety-check`).send({ checks: SAFETY_CHECKS.map((c) => c.id) })).status).toBe(200);
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'pb-grid-'));
  for (let i = 1; i <= COUNT; i++) {
    const name = i === 13 ? BROKEN : `pull-${String(i).padStart(2, '0')}.csv`;
    // One file holds only a header and a single row: it is kept but cannot become a curve.
    const text = i === 13 ? 'Engine Speed [rpm],Torque [lb-ft],Power [hp]\n2000,80,30\n' : syntheticRunFile({ seed: 900 + i, gain: 1 + i / 1000 }, {}).text;
    const file = path.join(dir, name);
    fs.writeFileSync(file, text);
    files.push(file);
  }
}, 120_000);

afterAll(async () => {
  await h?.close();
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

describe('forty files at once', () => {
  it('shows a compact grid, keeps the counter in view, offers Read again, and the session page keeps the batch', async () => {
    const page = await h.signInPage(shop.users.tuner.email);
    await page.goto(`${h.baseUrl}/upload?bikeId=${shop.bike.id}&sessionId=${sessionId}`);
    await visible(page, 'Safety checks confirmed');
    await page.locator('input[type=file]').setInputFiles(files);
    await page.getByRole('button', { name: `Upload ${COUNT} files` }).click();
    await expect.poll(() => page.getByText(`${COUNT} of ${COUNT} done`).first().isVisible(), { timeout: 120_000 }).toBe(true);
    await h.screenshot(page, `ux-${process.env.UX_SHOT ?? 'after'}-upload-results`);

    // A compact grid: forty files fit in well under the 7,968 px the one-card-per-file list took.
    const list = page.getByRole('list', { name: 'Uploaded files' });
    const box = await list.boundingBox();
    expect(box!.height).toBeLessThan(COUNT * 60);
    expect(await page.getByTestId('upload-item').count()).toBe(COUNT);
    const broken = page.getByTestId('upload-item').filter({ hasText: BROKEN });
    expect(await broken.getByRole('img', { name: 'Not read' }).count()).toBe(1);
    expect(await page.getByTestId('upload-item').filter({ hasText: 'pull-01.csv' }).getByRole('img', { name: 'Read' }).count()).toBe(1);

    // Scrolled to the end, the counter is still on screen.
    await page.mouse.wheel(0, 20_000);
    await page.waitForTimeout(200);
    const counter = page.getByTestId('upload-counter');
    const cbox = await counter.boundingBox();
    const viewport = page.viewportSize()!;
    expect(cbox!.y).toBeGreaterThanOrEqual(0);
    expect(cbox!.y + cbox!.height).toBeLessThanOrEqual(viewport.height);

    // Tick every read run and set their stage at once: a progress bar while it works, then one
    // summary toast, which sits above the action bar instead of over its controls.
    await page.evaluate(() => {
      const w = window as unknown as { __bulk: string[] };
      w.__bulk = [];
      new MutationObserver(() => {
        if (document.querySelector('[role=progressbar]')) w.__bulk.push('progress');
      }).observe(document.body, { subtree: true, childList: true });
    });
    await page.getByLabel('Select every read run').check();
    const bar = page.getByRole('region', { name: 'Selected runs' });
    await visible(page, `${COUNT - 1} runs selected`);
    await bar.getByLabel('Set their stage').selectOption({ label: 'Baseline' });
    const toast = page.getByRole('region', { name: 'Notifications' }).getByRole('listitem').filter({ hasText: `Tagged ${COUNT - 1} runs as Baseline` });
    await expect.poll(() => toast.isVisible(), { timeout: 60_000 }).toBe(true);
    expect(await page.evaluate(() => (window as unknown as { __bulk: string[] }).__bulk.length)).toBeGreaterThan(0);
    expect(await page.getByRole('region', { name: 'Notifications' }).getByText(/^Tagged pull-/).count()).toBe(0);
    // The lines of the batch show the new stage in the run's name.
    await expect.poll(() => page.getByTestId('upload-item').filter({ hasText: 'pull-01.csv' }).getByText(/^Baseline · pull \d+$/).count()).toBe(1);
    // The selection is cleared after the change, so tick two runs again to see the bar with a toast up.
    await page.getByLabel('Select pull-01.csv').check();
    await page.getByLabel('Select pull-02.csv').check();
    await expect.poll(() => bar.isVisible()).toBe(true);
    const barBox = (await bar.boundingBox())!;
    const toastBox = (await toast.boundingBox())!;
    const overlaps = toastBox.x < barBox.x + barBox.width && barBox.x < toastBox.x + toastBox.width && toastBox.y < barBox.y + barBox.height && barBox.y < toastBox.y + toastBox.height;
    expect(overlaps, `toast ${JSON.stringify(toastBox)} over bar ${JSON.stringify(barBox)}`).toBe(false);
    await h.screenshot(page, 'ux-after-bulk-bar');
    await bar.getByRole('button', { name: 'Clear selection' }).click();
    const tuner = await h.t.signIn(shop.users.tuner);
    const tagged = (await tuner.get('/api/runs').query({ sessionId, pageSize: 100 })).body.items as { stageName: string | null; status: string }[];
    expect(tagged.filter((r) => r.status === 'ready').every((r) => r.stageName === 'Baseline')).toBe(true);

    // "Read again" calls the reprocess API for the kept file; it still cannot be read.
    await broken.getByRole('button', { name: `Read ${BROKEN} again` }).click();
    await visible(page, `${BROKEN} was read again`);

    // After leaving the page, the session page lists the batch with the same statuses.
    await page.goto(`${h.baseUrl}/sessions/${sessionId}`);
    const latest = page.getByRole('region', { name: 'Latest upload' });
    await expect.poll(() => latest.getByTestId('upload-item').count()).toBe(COUNT);
    expect(await latest.getByTestId('upload-item').filter({ hasText: BROKEN }).getByRole('img', { name: 'Not read' }).count()).toBe(1);

    // On the session page, tick one run and make it its stage's reference from the bar.
    const table = page.getByRole('table', { name: 'Runs of this session' });
    await table.getByLabel('Select pull-01.csv').check();
    await bar.getByRole('button', { name: 'Make reference' }).click();
    await visible(page, 'pull-01.csv now represents Baseline');
    await expect.poll(() => table.getByText('Reference of Baseline').isVisible(), { timeout: 10_000 }).toBe(true);
    await h.screenshot(page, 'ux-after-session-latest-upload');
  }, 240_000);

  it('asks before leaving the page while files are still uploading', async () => {
    const page = await h.signInPage(shop.users.tuner.email);
    await page.goto(`${h.baseUrl}/upload?bikeId=${shop.bike.id}&sessionId=${sessionId}`);
    await visible(page, 'Safety checks confirmed');
    const cdp = await page.context().newCDPSession(page);
    await cdp.send('Network.enable');
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 50, downloadThroughput: -1, uploadThroughput: 20_000 });
    await page.locator('input[type=file]').setInputFiles(files.slice(0, 3));
    await page.getByRole('button', { name: 'Upload 3 files' }).click();
    await expect.poll(() => page.getByRole('progressbar').count()).toBeGreaterThan(0);
    // A link inside the app: the router's blocker asks first.
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Runs', exact: true }).click();
    const ask = page.getByRole('dialog', { name: 'Leave while files are uploading?' });
    await expect.poll(() => ask.isVisible()).toBe(true);
    await ask.getByRole('button', { name: 'Stay on this page' }).click();
    expect(new URL(page.url()).pathname).toBe('/upload');
    // Closing the tab or reloading: the browser's own "leave site?" prompt.
    const dialogs: string[] = [];
    page.on('dialog', (d) => {
      dialogs.push(d.type());
      void d.dismiss();
    });
    await page.reload().catch(() => undefined);
    expect(dialogs).toContain('beforeunload');
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });
  }, 120_000);
});
