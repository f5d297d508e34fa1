/**
 * A dyno session end to end, in a real browser: a tuner picks the bike, starts a session with its
 * air conditions, ticks the bay safety checks, drops three run files at once and watches each one
 * upload; one file has no recognisable engine-speed header, so the tuner maps its columns by hand
 * in the dialog. The run page then draws the curve and recomputes units and correction in the
 * browser from the stored uncorrected curve.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { chromium } from 'playwright-core';
import { SAFETY_CHECKS } from '@shared/schemas/run';
import { startBrowserHarness, visible, type BrowserHarness } from '../support/browser';
import { syntheticRunFile, type SyntheticRun } from '@server/db/synthetic-runs';
import type { TestShop } from '../support/test-app';

/**
 * Invented session conditions, typed in the test shop's units (imperial, the default): °F and inHg.
 * Dry air (0 % humidity) keeps the expected factor a closed form.
 */
const TYPED = { temperatureF: 86, baroInHg: 29, humidityPct: 0 };
/**
 * The same air in the API's units. NIST SP 811 (2008), B.9: t/°C = (t/°F − 32) / 1.8;
 * 1 inHg (32 °F) = 3.38638 kPa.
 */
const AIR = { temperatureC: (TYPED.temperatureF - 32) / 1.8, baroKpa: TYPED.baroInHg * 3.38638, humidityPct: TYPED.humidityPct };
/**
 * SAE J1349 (current form): CF = 1.176 · (99 / Pd) · √(T / 298 K) − 0.176, Pd the dry-air pressure
 * in kPa (here the barometric pressure, as the air is dry), T the air temperature in kelvin. The
 * reference temperature is taken as 25 °C = 298.15 K, as Pullbook's correction module documents.
 */
const SAE_J1349_FACTOR = 1.176 * (99 / AIR.baroKpa) * Math.sqrt((AIR.temperatureC + 273.15) / 298.15) - 0.176;
/** NIST SP 811 (2008), B.9: 1 hp (550 ft·lbf/s) = 745.6999 W. */
const KW_PER_HP = 0.7456999;

let h: BrowserHarness;
let shop: TestShop;
let dir: string;
const files: { name: string; file: string; run: SyntheticRun }[] = [];

/**
 * This playwright-core refuses a `--user-data-dir` launch argument (it wants a persistent context
 * for that), which the shared harness passes. Drop it here until the harness is changed; Playwright
 * gives each browser a fresh temporary profile anyway.
 */
function launchWithoutUserDataDir() {
  const launch = chromium.launch.bind(chromium);
  chromium.launch = (options = {}) => launch({ ...options, args: options.args?.filter((a) => !a.startsWith('--user-data-dir')) });
}

beforeAll(async () => {
  launchWithoutUserDataDir();
  h = await startBrowserHarness();
  shop = await h.t.createShop('Saltmarsh Speed Shop');
  const owner = await h.t.signIn(shop.users.owner);
  expect((await owner.post('/api/dynos').send({ name: 'Bay 1 roller', kind: 'inertia' })).status).toBe(201);
  expect((await owner.post('/api/stages').send({ bikeId: shop.bike.id, name: 'Baseline' })).status).toBe(201);

  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'pb-upload-'));
  // Sampled densely so each file is big enough for the progress bar to move under throttling.
  const make = (name: string, seed: number, gain: number, rename?: boolean) => {
    const { run, text } = syntheticRunFile({ seed, gain, sampleHz: 120 }, {});
    const body = rename ? text.replace('Engine Speed [rpm]', 'Drum') : text;
    const file = path.join(dir, name);
    fs.writeFileSync(file, body);
    files.push({ name, file, run });
  };
  make('pull-01.csv', 501, 1);
  make('pull-02.csv', 502, 1.01);
  // "Drum" reads like roller speed, so the reader does not take it for engine speed.
  make('pull-03-drum.csv', 503, 1.02, true);
}, 120_000);

afterAll(async () => {
  await h?.close();
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

function numberIn(text: string, re: RegExp): number {
  const m = re.exec(text);
  if (!m) throw new Error(`${re} not found in: ${text}`);
  return Number(m[1].replace(/,/g, '').replace('\u2212', '-'));
}

describe('uploading a dyno session', () => {
  let mappedRunId = '';

  it('a tuner uploads three files with progress, maps one by hand and tags a stage', async () => {
    const page = await h.signInPage(shop.users.tuner.email);
    await page.goto(`${h.baseUrl}/upload`);
    await expect.poll(() => page.getByRole('heading', { name: 'Upload runs', level: 1 }).isVisible()).toBe(true);

    await page.getByLabel('Search bikes').fill('Own');
    await page.getByRole('button', { name: /Choose 2020 Testmake Own/ }).click();
    await visible(page, 'This bike has no sessions yet');

    await page.getByRole('button', { name: 'New session' }).click();
    const form = page.getByRole('form', { name: 'New session' });
    await form.getByLabel('Dyno').selectOption({ label: 'Bay 1 roller' });
    // The shop works in °F and inHg; a kPa figure typed there is caught as the wrong unit.
    expect(await form.getByLabel('Units for the conditions').inputValue()).toBe('imperial');
    await form.getByLabel('Ambient temperature').fill(String(TYPED.temperatureF));
    await form.getByLabel('Barometric pressure').fill('98');
    await form.getByLabel('Relative humidity').focus();
    await visible(page, 'That looks like kPa, not inHg — switch units?');
    await h.screenshot(page, 'upload-00-session-form');
    await form.getByLabel('Barometric pressure').fill(String(TYPED.baroInHg));
    await form.getByLabel('Relative humidity').fill(String(TYPED.humidityPct));
    await expect.poll(() => page.getByText('That looks like kPa').count()).toBe(0);
    expect(await form.getByLabel('Correction standard').inputValue()).toBe('sae-j1349');
    await form.getByRole('button', { name: 'Create session' }).click();
    await visible(page, 'Safety checks for this session');
    // Stored in the API's units, converted from what was typed.
    const created = (await (await h.t.signIn(shop.users.tuner)).get('/api/sessions').query({ bikeId: shop.bike.id })).body.items[0];
    expect(created.ambientTempC).toBeCloseTo(AIR.temperatureC, 6);
    expect(created.baroKpa).toBeCloseTo(AIR.baroKpa, 6);
    // Shown back in the shop's units, as typed.
    await visible(page, `${TYPED.temperatureF.toFixed(1)} °F`);
    await visible(page, `${TYPED.baroInHg.toFixed(2)} inHg`);

    // The run files stay locked until every check is ticked and confirmed.
    const input = page.locator('input[type=file]');
    expect(await input.isDisabled()).toBe(true);
    expect(await page.getByRole('note').filter({ hasText: 'Before anyone pulls on the dyno' }).textContent()).toContain('wheel chocks');
    const confirm = page.getByRole('button', { name: 'Confirm safety checks' });
    for (const check of SAFETY_CHECKS.slice(0, -1)) await page.getByLabel(check.label).check();
    expect(await confirm.isDisabled()).toBe(true);
    await page.getByLabel(SAFETY_CHECKS[SAFETY_CHECKS.length - 1].label).check();
    await h.screenshot(page, 'upload-01-session-and-checks');
    await confirm.click();
    await visible(page, 'Safety checks confirmed');
    expect(await input.isDisabled()).toBe(false);

    await input.setInputFiles(files.map((f) => f.file));
    await visible(page, '3 files chosen');

    // Record every progress value the bars show, and slow the upload so the bars have time to move.
    await page.evaluate(() => {
      const seen: Record<string, number[]> = {};
      (window as unknown as { __progress: typeof seen }).__progress = seen;
      const record = () => {
        document.querySelectorAll('[role=progressbar]').forEach((bar) => {
          const label = document.getElementById(bar.getAttribute('aria-labelledby') ?? '')?.textContent ?? '';
          const now = Number(bar.getAttribute('aria-valuenow'));
          (seen[label] ??= []).push(now);
        });
      };
      new MutationObserver(record).observe(document.body, { subtree: true, childList: true, attributes: true, attributeFilter: ['aria-valuenow'] });
    });
    const cdp = await page.context().newCDPSession(page);
    await cdp.send('Network.enable');
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 20, downloadThroughput: -1, uploadThroughput: 60_000 });

    await page.getByRole('button', { name: 'Upload 3 files' }).click();
    await expect.poll(() => page.getByRole('progressbar').count()).toBeGreaterThan(0);
    await h.screenshot(page, 'upload-02-progress');
    await visible(page, '3 of 3 done');
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });

    const progress = await page.evaluate(() => (window as unknown as { __progress: Record<string, number[]> }).__progress);
    for (const f of files) {
      const values = Object.entries(progress).filter(([label]) => label.includes(f.name)).flatMap(([, v]) => v);
      expect(values.length, `a progress bar for ${f.name}`).toBeGreaterThan(0);
    }
    // With the line throttled, at least one bar was seen part-way, not only empty or full.
    const all = Object.values(progress).flat();
    expect(all.some((v) => v > 0 && v < 100)).toBe(true);

    const items = page.getByTestId('upload-item');
    expect(await items.count()).toBe(3);
    const rowOf = (name: string) => items.filter({ hasText: name });
    for (const f of files.slice(0, 2)) {
      const text = (await rowOf(f.name).textContent()) ?? '';
      expect(text).toContain('Read');
      expect(text).toContain('Power and torque agree');
      // The shown peak is the server's SAE J1349 figure: the model's peak × the factor, within
      // the resampling and noise of the invented run (2 %).
      const shown = numberIn(text, /Peak power([\d,.]+) hp/);
      expect(Math.abs(shown / (f.run.truth.peakPower.hp * SAE_J1349_FACTOR) - 1)).toBeLessThan(0.02);
    }
    const drumRow = rowOf('pull-03-drum.csv');
    await expect.poll(() => drumRow.getByText('Needs column mapping').isVisible()).toBe(true);
    await h.screenshot(page, 'upload-03-results');

    // Quick stage tagging of the first file.
    await rowOf('pull-01.csv').getByLabel('Stage of pull-01.csv').selectOption({ label: 'Baseline' });
    await visible(page, 'Tagged pull-01.csv as Baseline');

    await drumRow.getByRole('button', { name: 'Choose columns…' }).click();
    const dialog = page.getByRole('dialog', { name: 'Choose the columns' });
    await expect.poll(() => dialog.getByRole('region', { name: 'Preview of the file' }).isVisible()).toBe(true);
    const header = (await dialog.locator('thead').textContent()) ?? '';
    expect(header).toContain('Drum');
    // The invented run idles at 2,000 rpm (± a few rpm of noise) before the sweep.
    const firstDrum = Number(await dialog.locator('tbody tr').first().locator('td').nth(1).textContent());
    expect(Math.abs(firstDrum - 2000)).toBeLessThan(25);
    await dialog.getByLabel('Engine speed (rpm) column').selectOption('Drum');
    await dialog.getByLabel('Torque column').selectOption('Torque [lb-ft]');
    await dialog.getByLabel('Torque unit').selectOption('lbft');
    await dialog.getByLabel('Power column').selectOption('Power [hp]');
    await dialog.getByLabel('Power unit').selectOption('hp');
    await dialog.getByLabel('Save this layout for files with the same header').check();
    await dialog.getByLabel('Layout name').fill('Drum-header export');
    await h.screenshot(page, 'upload-04-mapping-dialog');
    await dialog.getByRole('button', { name: 'Read with these columns' }).click();
    await expect.poll(() => dialog.isVisible()).toBe(false);
    await expect.poll(() => drumRow.getByText('Power and torque agree').isVisible()).toBe(true);
    const href = await drumRow.getByRole('link', { name: 'Open run' }).getAttribute('href');
    mappedRunId = href?.split('/').pop() ?? '';
    expect(mappedRunId).toMatch(/^[0-9a-f-]{36}$/);

    // What the browser showed is what the archive holds.
    const tuner = await h.t.signIn(shop.users.tuner);
    const list = await tuner.get('/api/runs').query({ bikeId: shop.bike.id, pageSize: 50 });
    const runs = list.body.items as { originalName: string; status: string; stageName: string | null }[];
    expect(runs.map((r) => r.originalName).sort()).toEqual(files.map((f) => f.name).sort());
    expect(runs.every((r) => r.status === 'ready')).toBe(true);
    expect(runs.find((r) => r.originalName === 'pull-01.csv')?.stageName).toBe('Baseline');
    const layouts = await tuner.get('/api/column-layouts');
    expect((layouts.body.items as { name: string }[]).map((l) => l.name)).toContain('Drum-header export');
  }, 120_000);

  it('the run page draws the mapped run and switches units and correction in the browser', async () => {
    const page = await h.signInPage(shop.users.tuner.email);
    await page.goto(`${h.baseUrl}/runs/${mappedRunId}`);
    // The run's one name (stage · pull n), with its file beside it.
    await expect.poll(() => page.getByRole('heading', { name: /^No stage · pull \d$/, level: 1 }).isVisible()).toBe(true);
    await visible(page, 'pull-03-drum.csv');
    const chartCard = page.getByRole('region', { name: 'Power and torque' });
    await expect.poll(() => chartCard.locator('canvas').first().isVisible()).toBe(true);
    const truth = files[2].run.truth;
    const stats = async () => (await chartCard.textContent()) ?? '';

    // Corrected to the session's standard, SAE J1349, by default.
    await expect.poll(async () => numberIn(await stats(), /Correction factor([\d.]+)/)).toBeCloseTo(SAE_J1349_FACTOR, 3);
    const correctedHp = numberIn(await stats(), /Peak power([\d,.]+)hp/);
    expect(Math.abs(correctedHp / (truth.peakPower.hp * SAE_J1349_FACTOR) - 1)).toBeLessThan(0.02);
    await h.screenshot(page, 'upload-05-run-page');

    await chartCard.getByLabel('Correction').selectOption('none');
    await expect.poll(async () => (await stats()).includes('Correction factornone')).toBe(true);
    const rawHp = numberIn(await stats(), /Peak power([\d,.]+)hp/);
    expect(Math.abs(rawHp / truth.peakPower.hp - 1)).toBeLessThan(0.02);
    // Dividing out the factor the page applied gives the uncorrected figure (to display rounding).
    expect(Math.abs(correctedHp / SAE_J1349_FACTOR - rawHp)).toBeLessThan(0.15);
    const rawTorque = numberIn(await stats(), /Peak torque([\d,.]+)lb·ft/);
    expect(Math.abs(rawTorque / truth.peakTorque.lbft - 1)).toBeLessThan(0.02);

    // The tooltip names engine speed in whole rpm ("4,450 rpm"), not "4,450.00".
    const canvas = await chartCard.locator('canvas').first().boundingBox();
    await page.mouse.move(canvas!.x + canvas!.width / 2, canvas!.y + canvas!.height / 2);
    // The tooltip's heading is a block of its own whose whole text is the engine speed.
    const tooltipRpm = chartCard.locator('div').filter({ hasText: /^\d{1,2},\d{3} rpm$/ });
    await expect.poll(() => tooltipRpm.count()).toBeGreaterThan(0);

    await chartCard.getByLabel('Power unit').selectOption('kw');
    await chartCard.getByLabel('Torque unit').selectOption('nm');
    await expect.poll(async () => /Peak power[\d,.]+kW/.test(await stats())).toBe(true);
    // The choices live in the URL, so a reload keeps them.
    await expect.poll(() => new URL(page.url()).searchParams.get('power')).toBe('kw');
    await page.reload();
    await expect.poll(async () => /Peak power[\d,.]+kW/.test(await stats())).toBe(true);
    expect(await chartCard.getByLabel('Correction').inputValue()).toBe('none');
    const kw = numberIn(await stats(), /Peak power([\d,.]+)kW/);
    expect(Math.abs(kw - rawHp * KW_PER_HP)).toBeLessThan(0.1);
    // NIST SP 811 (2008), B.9: 1 lbf·ft = 1.355818 N·m.
    const nm = numberIn(await stats(), /Peak torque([\d,.]+)N·m/);
    expect(Math.abs(nm - rawTorque * 1.355818)).toBeLessThan(0.15);

    // A tablet in portrait: the chart keeps the full width of its card.
    await page.setViewportSize({ width: 768, height: 1024 });
    await expect.poll(async () => (await chartCard.locator('canvas').first().boundingBox())?.width ?? 0).toBeGreaterThan(600);
    await h.screenshot(page, 'upload-06-run-page-tablet');
  }, 90_000);

  it('the session page lists the visit, marks a reference run, and the run list filters through the URL', async () => {
    const page = await h.signInPage(shop.users.tuner.email);
    const tuner = await h.t.signIn(shop.users.tuner);
    const sessions = await tuner.get('/api/sessions').query({ bikeId: shop.bike.id });
    expect(sessions.body.items.length).toBe(1);
    await page.goto(`${h.baseUrl}/sessions/${sessions.body.items[0].id}`);
    const table = page.getByRole('table', { name: 'Runs of this session' });
    await expect.poll(() => table.locator('tbody tr').count()).toBe(3);
    expect(await page.getByText('Safety checks confirmed').first().isVisible()).toBe(true);
    await table.getByRole('button', { name: /^Make reference: Baseline · pull \d \(pull-01\.csv\) for Baseline$/ }).click();
    await expect.poll(() => table.getByText('Reference of Baseline').isVisible()).toBe(true);
    await h.screenshot(page, 'upload-07-session-page');
    const stages = await tuner.get('/api/stages').query({ bikeId: shop.bike.id });
    const pull01 = (await tuner.get('/api/runs').query({ bikeId: shop.bike.id })).body.items.find((r: { originalName: string }) => r.originalName === 'pull-01.csv');
    expect(stages.body.items[0].referenceRunId).toBe(pull01.id);

    // Sorted by peak power, highest first: the three invented runs were scaled ×1, ×1.01, ×1.02.
    await page.goto(`${h.baseUrl}/runs?bikeId=${shop.bike.id}&sort=-peakPowerHp`);
    const runs = page.getByRole('table', { name: 'Runs' });
    await expect.poll(() => runs.locator('tbody tr').count()).toBe(3);
    // Each run's file is its secondary text, under its name.
    const names = await runs.locator('tbody tr td:nth-child(2) a + span').allTextContents();
    expect(names).toEqual(['pull-03-drum.csv', 'pull-02.csv', 'pull-01.csv']);
    await page.getByLabel('Status').selectOption('needs-mapping');
    await expect.poll(() => new URL(page.url()).searchParams.get('status')).toBe('needs-mapping');
    await expect.poll(() => runs.getByText('No run matches these filters.').isVisible()).toBe(true);
    await h.screenshot(page, 'upload-08-run-list');

    // A tablet in portrait still shows both peaks.
    await page.getByLabel('Status').selectOption('');
    await page.setViewportSize({ width: 768, height: 1024 });
    await expect.poll(() => runs.locator('tbody tr').count()).toBe(3);
    const viewport = 768;
    for (const name of ['Peak power', 'Peak torque']) {
      const box = await runs.getByRole('columnheader', { name }).boundingBox();
      expect(box && box.x + box.width, `${name} on screen`).toBeLessThanOrEqual(viewport);
    }
    await h.screenshot(page, 'upload-09-run-list-tablet');
  }, 90_000);

  it('a customer who opens staff pages by URL gets a plain page, not failing screens', async () => {
    const page = await h.signInPage(shop.users.customer.email);
    const tuner = await h.t.signIn(shop.users.tuner);
    const sessionId = (await tuner.get('/api/sessions').query({ bikeId: shop.bike.id })).body.items[0].id;
    for (const url of ['/runs', '/upload', `/sessions/${sessionId}`, '/settings/dynos']) {
      await page.goto(`${h.baseUrl}${url}`);
      await visible(page, 'Not available for your role');
    }
  }, 60_000);
});
