/**
 * A log holding several pulls, in a real browser: a tuner uploads one file with three pulls (two
 * full sweeps and one aborted early) into a session; the upload results say "3 pulls found" and
 * list each pull as a run of its own, the session page says the same, and the aborted pull is
 * marked partial on its run page.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SAFETY_CHECKS } from '@shared/schemas/run';
import { startBrowserHarness, visible, type BrowserHarness } from '../support/browser';
import { renderRunFile, syntheticRun, threePullLog } from '@server/db/synthetic-runs';
import type { TestShop } from '../support/test-app';

let h: BrowserHarness;
let shop: TestShop;
let dir: string;
let file: string;
let sessionId: string;
const NAME = 'session-three-pulls.csv';
const ROAD = 'road-speed-only.csv';
let roadFile: string;
// The generator logs road speed as rpm / 46: 46 rpm per mph in that gear (invented).
const ROAD_RUN = syntheticRun({ seed: 21, rpmNoise: 2, torqueNoise: 0.05 });

beforeAll(async () => {
  h = await startBrowserHarness();
  shop = await h.t.createShop('Ferrybank Dyno Bay');
  const tuner = await h.t.signIn(shop.users.tuner);
  const created = await tuner.post('/api/sessions').send({ bikeId: shop.bike.id, ambientTempC: 25, baroKpa: 99, humidityPct: 0, correctionStandard: 'sae-j1349' });
  expect(created.status).toBe(201);
  sessionId = created.body.id;
  expect((await tuner.post(`/api/sessions/${sessionId}/safety-check`).send({ checks: SAFETY_CHECKS.map((c) => c.id) })).status).toBe(200);

  // Invented log: three pulls, the last aborted at 3,400 rpm.
  const log = threePullLog(5);
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'pb-pulls-'));
  file = path.join(dir, NAME);
  fs.writeFileSync(file, renderRunFile(log).bytes);
  roadFile = path.join(dir, ROAD);
  fs.writeFileSync(roadFile, renderRunFile(ROAD_RUN, { columns: ['time', 'speed', 'torque', 'power'] }).bytes);
}, 120_000);

afterAll(async () => {
  await h?.close();
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

describe('uploading a log with several pulls', () => {
  it('shows "3 pulls found" with each pull as a run, on the upload screen and the session page', async () => {
    const page = await h.signInPage(shop.users.tuner.email);
    await page.goto(`${h.baseUrl}/upload?bikeId=${shop.bike.id}&sessionId=${sessionId}`);
    await visible(page, 'Safety checks confirmed');
    const input = page.locator('input[type=file]');
    await expect.poll(() => input.isDisabled()).toBe(false);
    await input.setInputFiles([file]);
    await page.getByRole('button', { name: 'Upload 1 file' }).click();
    await visible(page, '1 of 1 done');

    const item = page.getByTestId('upload-item').filter({ hasText: NAME });
    await expect.poll(() => item.getByTestId('pulls-found').textContent()).toBe(`3 pulls found in ${NAME}`);
    const pulls = item.getByTestId('pull-run');
    expect(await pulls.count()).toBe(3);
    for (let i = 0; i < 3; i++) expect(await pulls.nth(i).textContent()).toContain(`Pull ${i + 1} of 3`);
    expect(await pulls.nth(2).getByText('Partial pull').isVisible()).toBe(true);
    expect(await pulls.nth(0).getByText('Partial pull').count()).toBe(0);
    await h.screenshot(page, 'upload-pulls-01-results');

    // The archive holds three runs of the one file.
    const tuner = await h.t.signIn(shop.users.tuner);
    const runs = (await tuner.get('/api/runs').query({ sessionId, sort: 'createdAt', pageSize: 50 })).body.items as { id: string; originalName: string; pullIndex: number; sequence: number }[];
    expect(runs.map((r) => r.originalName)).toEqual([NAME, NAME, NAME]);
    expect(runs.map((r) => r.pullIndex).sort()).toEqual([0, 1, 2]);

    await page.goto(`${h.baseUrl}/sessions/${sessionId}`);
    const table = page.getByRole('table', { name: 'Runs of this session' });
    await expect.poll(() => table.locator('tbody tr').count()).toBe(3);
    await expect.poll(() => page.getByTestId('pulls-found').first().textContent()).toContain(`3 pulls found in ${NAME}: runs 1, 2, 3`);
    expect(await table.getByText('Partial pull').count()).toBe(1);
    await h.screenshot(page, 'upload-pulls-02-session');

    const partial = runs.find((r) => r.pullIndex === 2)!;
    await page.goto(`${h.baseUrl}/runs/${partial.id}`);
    await visible(page, 'Pull 3 of 3');
    await visible(page, 'Partial pull');
    // The engine's warning is listed with its message.
    await expect.poll(() => page.locator('[data-code="PULL_PARTIAL"]').count()).toBe(1);
    await h.screenshot(page, 'upload-pulls-03-run-page');
  }, 120_000);

  it('a log with road speed only is read with an engine-speed ratio given in the mapping dialog', async () => {
    const page = await h.signInPage(shop.users.tuner.email);
    await page.goto(`${h.baseUrl}/upload?bikeId=${shop.bike.id}&sessionId=${sessionId}`);
    const input = page.locator('input[type=file]');
    await expect.poll(() => input.isDisabled()).toBe(false);
    await input.setInputFiles([roadFile]);
    await page.getByRole('button', { name: 'Upload 1 file' }).click();
    await visible(page, '1 of 1 done');
    const item = page.getByTestId('upload-item').filter({ hasText: ROAD });
    await expect.poll(() => item.getByText('Needs column mapping').isVisible()).toBe(true);
    await item.getByRole('button', { name: 'Choose columns…' }).click();
    const dialog = page.getByRole('dialog', { name: 'Choose the columns' });
    const useRatio = dialog.getByLabel('Compute engine speed from “Road Speed [mph]”');
    await expect.poll(() => useRatio.isVisible()).toBe(true);
    await useRatio.check();
    await dialog.getByLabel('Engine-speed ratio').fill('46');
    await dialog.getByLabel('per').selectOption('mph');
    await h.screenshot(page, 'upload-pulls-04-ratio');
    await dialog.getByRole('button', { name: 'Read with this ratio' }).click();
    await expect.poll(() => dialog.isVisible()).toBe(false);
    await expect.poll(() => item.getByText('Read', { exact: true }).isVisible()).toBe(true);
    const text = (await item.textContent()) ?? '';
    expect(text).toMatch(/engine speed was computed from/i);
    // SAE J1349 at 25 °C, 99 kPa, dry air is a factor of 1.176 · (99/99) · √(298.15/298.15) − 0.176 = 1
    // (the standard's current form), so the shown peak is the model's, within resampling and noise (2 %).
    const shown = Number(/Peak power([\d,.]+) hp/.exec(text)![1].replace(/,/g, ''));
    expect(Math.abs(shown / ROAD_RUN.truth.peakPower.hp - 1)).toBeLessThan(0.02);
    const tuner = await h.t.signIn(shop.users.tuner);
    const runs = (await tuner.get('/api/runs').query({ sessionId, pageSize: 50 })).body.items as { id: string; originalName: string }[];
    const run = await tuner.get(`/api/runs/${runs.find((r) => r.originalName === ROAD)!.id}`);
    expect(run.body.rpmPerSpeed).toEqual({ ratio: 46, unit: 'mph' });
  }, 120_000);
});
