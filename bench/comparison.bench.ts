/**
 * Comparison preview bench: POST /api/comparisons/preview for 2 runs and for 12 runs, 20
 * concurrent connections for 6 s per case (autocannon), against the real app on a free loopback
 * port with a PostgreSQL cluster of its own under storage/bench/comparison-postgres (migrated and
 * seeded with invented runs on each start; the data is small). Median and p95 from every
 * response's time. Target: p95 < 50 ms for 2 runs; 12 runs is reported.
 *
 * Every request computes its comparison in full; what repeats across requests is only the read
 * of the runs' parsed curves, which the read model caches by run id and updated_at
 * (server/modules/comparisons/comparison-runs.ts), as it does for a tuner changing options.
 *
 * Then the overlay of the 12 runs in the browser (the built client, Debian's Chromium through
 * playwright-core): the comparison page opened afresh five times, each time the time from the
 * chart option being built to ECharts' first finished frame (performance marks
 * 'pb:overlay-option' → measures 'pb:overlay-first-frame' and 'pb:overlay-render', set in
 * comparison-charts.tsx). Target: median of the finished frame < 150 ms.
 */
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import { chromium } from 'playwright-core';
import { STORAGE } from '../scripts/lib/paths.js';
import { buildClient } from '../scripts/lib/client-build.js';
import { percentile } from './lib/stats.js';
import { freePort, startLocalPostgres } from '../scripts/lib/local-services.js';
import { migrateToLatest } from '../server/db/orm.js';
import { hashPassword } from '../server/modules/auth/auth.service.js';
import { Shop } from '../server/modules/shops/shop.entity.js';
import { User } from '../server/modules/users/user.entity.js';
import { Customer } from '../server/modules/customers/customer.entity.js';
import { Bike } from '../server/modules/bikes/bike.entity.js';
import { ComparisonFixtures, humpWithPeaks } from '../tests/support/comparison-fixtures.js';
import { signIn, startBenchApp, type BenchApp } from './lib/app-server.js';
import { loadTest } from './lib/load.js';
import { printTable } from './lib/table.js';

const CONNECTIONS = 20;
const DURATION_S = 6;
const PASSWORD = 'bench-comparison-password';

function load(baseUrl: string, cookie: string, body: string) {
  return loadTest({ url: `${baseUrl}/api/comparisons/preview`, connections: CONNECTIONS, duration: DURATION_S, method: 'POST', headers: { cookie, 'content-type': 'application/json', origin: baseUrl }, body });
}

const BROWSER_RENDERS = 5;
/** The 12-run overlay, option built → finished frame, median of the page opened afresh. */
const OVERLAY_TARGET_MS = 150;

/** Opens the 12-run comparison page `times` times; each time, option built → first frame and → finished frame (ms). */
async function overlayRenderTimes(baseUrl: string, email: string, runIds: string[], times: number): Promise<{ finished: number; firstFrame: number }[]> {
  const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', headless: true, args: ['--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'] });
  try {
    const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await context.newPage();
    page.setDefaultTimeout(30_000);
    await page.goto(`${baseUrl}/login`);
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill(PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL((u) => !u.pathname.startsWith('/login'));
    const out: { finished: number; firstFrame: number }[] = [];
    for (let i = 0; i < times; i++) {
      await page.goto(`${baseUrl}/comparisons/new?runIds=${runIds.join(',')}&baselineRunId=${runIds[0]}`);
      await page.waitForFunction(() => performance.getEntriesByName('pb:overlay-render').length > 0, undefined, { timeout: 30_000 });
      out.push(
        await page.evaluate(() => ({
          finished: performance.getEntriesByName('pb:overlay-render')[0].duration,
          firstFrame: performance.getEntriesByName('pb:overlay-first-frame')[0]?.duration ?? Number.NaN,
        })),
      );
    }
    return out;
  } finally {
    await browser.close();
  }
}

/** Prints the comparison bench table. */
export async function run(): Promise<void> {
  const clientDir = path.join(STORAGE, 'bench', 'client');
  buildClient(clientDir);
  const pgService = await startLocalPostgres({ baseDir: path.join(STORAGE, 'bench', 'comparison-postgres'), port: await freePort(), database: 'pullbook_compare', label: 'bench-compare-postgres' });
  let app: BenchApp | null = null;
  try {
    app = await startBenchApp({ databaseUrl: pgService.url, poolMax: CONNECTIONS, prepare: (deps) => migrateToLatest(deps.orm), clientDir });
    const { baseUrl, deps } = app;

    // A fresh invented shop each start (the cluster is reused; old shops are simply ignored).
    const em = deps.orm.em.fork();
    const tag = randomBytes(4).toString('hex');
    const shop = em.create(Shop, { name: `Bench Compare ${tag}` } as Shop);
    const customer = em.create(Customer, { shop, name: 'Bench Rider' } as Customer);
    const email = `tuner-${tag}@bench.test`;
    em.create(User, { shop, email, name: 'Bench tuner', role: 'tuner', passwordHash: await hashPassword(PASSWORD, 4), customer: null } as User);
    const bike = em.create(Bike, { shop, customer, make: 'Benchmake', model: 'Twelve', cylinders: 2 } as Bike);
    const f = new ComparisonFixtures(em, shop);
    const session = f.session(bike, { dyno: f.dyno(), ambientTempC: 21, baroKpa: 100.8, humidityPct: 40 });
    const stages = [f.stage(bike, 'Stock', 0), f.stage(bike, 'Stage 1', 1), f.stage(bike, 'Stage 2', 2)];
    const runs = Array.from({ length: 12 }, (_, i) =>
      f.run(bike, { curve: humpWithPeaks(95 + i, 3000 + 40 * i, 85 + i * 1.3), stage: stages[i % 3], session, label: `Bench pull ${i + 1}`, conditions: { temperatureC: 21, baroKpa: 100.8, humidityPct: 40 } }),
    );
    await em.flush();

    const cookie = await signIn(baseUrl, email, PASSWORD);

    const ids = runs.map((r) => r.id);
    const cases = [
      { name: 'preview, 2 runs', body: JSON.stringify({ runIds: ids.slice(0, 2), baselineRunId: ids[0], options: { correction: 'sae-j1349' } }), targetMs: 50 as number | null },
      { name: 'preview, 12 runs', body: JSON.stringify({ runIds: ids, baselineRunId: ids[0], options: { correction: 'sae-j1349' } }), targetMs: null },
    ];
    for (const c of cases) {
      const warm = await fetch(`${baseUrl}/api/comparisons/preview`, { method: 'POST', headers: { cookie, 'content-type': 'application/json', origin: baseUrl }, body: c.body });
      if (warm.status !== 200) throw new Error(`${c.name}: ${warm.status} ${await warm.text()}`);
    }
    const rows = [['case', 'requests', 'non-200', 'median ms', 'p95 ms', 'target p95', 'result']];
    for (const c of cases) {
      const r = await load(baseUrl, cookie, c.body);
      const ok = r.errors === 0 && (c.targetMs === null || r.p95Ms < c.targetMs);
      rows.push([c.name, String(r.requests), String(r.errors), r.medianMs.toFixed(1), r.p95Ms.toFixed(1), c.targetMs === null ? 'reported' : `< ${c.targetMs} ms`, ok ? 'ok' : 'OVER TARGET']);
    }
    await app.settle();
    const marks = await overlayRenderTimes(baseUrl, email, ids, BROWSER_RENDERS);
    const renders = marks.map((m) => m.finished).sort((x, y) => x - y);
    const firstFrames = marks.map((m) => m.firstFrame).sort((x, y) => x - y);
    rows.push([`overlay of 12 runs: first frame`, String(firstFrames.length), '—', percentile(firstFrames, 0.5).toFixed(1), `max ${firstFrames[firstFrames.length - 1].toFixed(1)}`, 'reported', 'ok']);
    const overlayOk = percentile(renders, 0.5) < OVERLAY_TARGET_MS;
    rows.push([`overlay of 12 runs: finished frame`, String(renders.length), '—', percentile(renders, 0.5).toFixed(1), `max ${renders[renders.length - 1].toFixed(1)}`, `median < ${OVERLAY_TARGET_MS} ms`, overlayOk ? 'ok' : 'OVER TARGET']);
    printTable(rows);
    process.stdout.write(`${CONNECTIONS} concurrent connections, ${DURATION_S} s per case; each run 81 points (2,000–6,000 rpm, 50 rpm grid), 4 runs per stage for the spread; curves from the read model's cache after the first request\n`);
  } finally {
    if (app) await app.close();
    await pgService.stop();
  }
}
