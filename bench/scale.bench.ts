/**
 * Everyday pages on a large archive (`npm run bench -- scale`). For each archive size — 10 000
 * bikes / 100 000 runs and 100 000 bikes / 1 000 000 runs, each seeded once by seed:large into a
 * database of its own in the bench cluster (storage/bench/) — the app runs in a process of its
 * own, and every list and detail route a page calls is loaded by 10 concurrent signed-in clients.
 * Each route's p50 and p97.5 are printed with the ratio of its p97.5 to that of GET /api/auth/me
 * measured in the same run: a ratio, not an absolute time, because absolute times on a shared
 * 2-core machine are noise. Target: every route within 10×, at both sizes.
 */
import path from 'node:path';
import pg from 'pg';
import { STORAGE } from '../scripts/lib/paths.js';
import { freePort, startLocalPostgres } from '../scripts/lib/local-services.js';
import { LARGE_SEED_PASSWORD } from '../server/cli/seed-large.js';
import { ensureLargeSeed } from './lib/large-seed.js';
import { signIn } from './lib/app-server.js';
import { startAppProcess } from './lib/app-process.js';
import { loadTest } from './lib/load.js';
import { percentile } from './lib/stats.js';
import { printTable } from './lib/table.js';

const CONNECTIONS = 10;
const DURATION_S = Number(process.env.SCALE_BENCH_SECONDS ?? 5);
const TARGET_RATIO = 10;
const SIZES = (process.env.SCALE_BENCH_BIKES ?? '10000,100000').split(',').map(Number);

async function ensureSeeded(adminUrl: string, database: string, bikes: number): Promise<string> {
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  const exists = (await admin.query('select 1 from pg_database where datname = $1', [database])).rowCount;
  if (!exists) await admin.query(`create database "${database}"`);
  await admin.end();
  const url = adminUrl.replace(/\/[^/]+$/, `/${database}`);
  await ensureLargeSeed(url, bikes);
  return url;
}

/** Ids to put in the detail routes: the signed-in shop's bike with the most runs, and others. */
async function sampleIds(url: string) {
  const db = new pg.Client({ connectionString: url });
  await db.connect();
  try {
    const shop = (await db.query(`select shop_id from app_user where email = 'owner1@large.test'`)).rows[0].shop_id as string;
    const bikes = (await db.query(`select bike_id as id from run where shop_id = $1 group by bike_id order by count(*) desc, bike_id limit 20`, [shop])).rows.map((r) => r.id as string);
    const customers = (await db.query(`select id from customer where shop_id = $1 order by id limit 20`, [shop])).rows.map((r) => r.id as string);
    const sessions = (await db.query(`select id from dyno_session where shop_id = $1 order by id limit 20`, [shop])).rows.map((r) => r.id as string);
    const runs = (await db.query(`select id from run where shop_id = $1 order by id limit 20`, [shop])).rows.map((r) => r.id as string);
    const runCount = (await db.query(`select count(*)::int as n from run where shop_id = $1`, [shop])).rows[0].n as number;
    return { bikes, customers, sessions, runs, runCount, cursors: [] as string[] };
  } finally {
    await db.end();
  }
}

/** Every route a page calls, with a rotating set of paths each. */
function routes(ids: Awaited<ReturnType<typeof sampleIds>>): { name: string; paths: string[] }[] {
  const each = (list: string[], f: (id: string) => string) => (list.length ? list.map(f) : []);
  const all: { name: string; paths: string[] }[] = [
    { name: 'GET /api/auth/me (reference)', paths: ['/api/auth/me'] },
    { name: 'Today: recent customers and bikes', paths: ['/api/customers?sort=-createdAt&page=1&pageSize=5', '/api/bikes?sort=-createdAt&page=1&pageSize=5'] },
    { name: 'runs, first page', paths: ['/api/runs'] },
    { name: 'runs, page 400', paths: ['/api/runs?page=400'] },
    { name: 'runs, next page by cursor', paths: ids.cursors.map((c) => `/api/runs?cursor=${c}`) },
    { name: 'runs, search', paths: ['/api/runs?q=vantor', '/api/runs?q=stage%202', '/api/runs?q=corvane', '/api/runs?q=rider%201234'] },
    { name: 'runs, search engine family and tags', paths: ['/api/runs?q=kestrel%20v2', '/api/runs?q=customer-present', '/api/runs?q=inline-4%20600'] },
    { name: 'runs, sorted', paths: ['/api/runs?sort=-peakPowerHp', '/api/runs?sort=peakTorqueLbft', '/api/runs?sort=createdAt'] },
    { name: 'runs, filtered', paths: [...each(ids.bikes.slice(0, 5), (id) => `/api/runs?bikeId=${id}`), ...each(ids.customers.slice(0, 5), (id) => `/api/runs?customerId=${id}`), '/api/runs?status=ready', '/api/runs?status=failed', '/api/runs?tag=reference', '/api/runs?from=2024-01-01&to=2024-06-30'] },
    { name: 'bikes', paths: ['/api/bikes', '/api/bikes?page=100', '/api/bikes?sort=-createdAt&pageSize=5'] },
    { name: 'bikes, search', paths: ['/api/bikes?q=corvane', '/api/bikes?q=ridge', '/api/bikes?q=vantor%20103'] },
    { name: 'customers', paths: ['/api/customers', '/api/customers?page=50', '/api/customers?sort=-createdAt&pageSize=5'] },
    { name: 'customers, search', paths: ['/api/customers?q=rider', '/api/customers?q=12'] },
    { name: 'bike page', paths: each(ids.bikes, (id) => `/api/bikes/${id}`) },
    { name: 'bike page: stages', paths: each(ids.bikes, (id) => `/api/stages?bikeId=${id}`) },
    { name: 'bike page: gains by stage', paths: each(ids.bikes, (id) => `/api/comparisons/timeline?bikeId=${id}`) },
    { name: 'bike page: sessions', paths: each(ids.bikes, (id) => `/api/sessions?bikeId=${id}`) },
    { name: 'sessions', paths: ['/api/sessions'] },
    { name: 'session page', paths: each(ids.sessions, (id) => `/api/sessions/${id}`) },
    { name: 'run page', paths: each(ids.runs, (id) => `/api/runs/${id}`) },
    { name: 'comparisons', paths: ['/api/comparisons', ...each(ids.bikes.slice(0, 5), (id) => `/api/comparisons?bikeId=${id}`)] },
    { name: 'reports', paths: ['/api/reports', ...each(ids.bikes.slice(0, 5), (id) => `/api/reports?bikeId=${id}`)] },
    { name: 'audit log', paths: ['/api/audit', '/api/audit?kinds=run', '/api/audit?kinds=report,comparison'] },
  ];
  return all.filter((r) => r.paths.length > 0);
}

async function measureSize(adminUrl: string, bikes: number) {
  const url = await ensureSeeded(adminUrl, bikes === 10_000 ? 'pullbook_large' : `pullbook_large_${bikes}`, bikes);
  const ids = await sampleIds(url);
  const app = await startAppProcess(url, CONNECTIONS * 2);
  try {
    const cookie = await signIn(app.baseUrl, 'owner1@large.test', LARGE_SEED_PASSWORD);
    // Keyset cursors as the list hands them out: a few pages deep in each order.
    for (const sort of ['-createdAt', '-peakPowerHp', 'peakTorqueLbft']) {
      let cursor: string | null = null;
      for (let page = 0; page < 4; page++) {
        const qs: string = cursor ? `&cursor=${encodeURIComponent(cursor)}` : '';
        const body = (await (await fetch(`${app.baseUrl}/api/runs?sort=${sort}${qs}`, { headers: { cookie } })).json()) as { nextCursor?: string | null };
        cursor = body.nextCursor ?? null;
        if (!cursor) break;
        ids.cursors.push(`${encodeURIComponent(cursor)}&sort=${sort}`);
      }
    }
    const list = routes(ids);
    for (const r of list) for (const p of r.paths) await fetch(app.baseUrl + p, { headers: { cookie } }); // warm-up
    const results: { name: string; requests: number; errors: number; p50: number; p975: number }[] = [];
    for (const r of list) {
      const res = await loadTest({ url: app.baseUrl, connections: CONNECTIONS, duration: DURATION_S, headers: { cookie } }, r.paths);
      const times = res.times;
      results.push({ name: r.name, requests: res.requests, errors: res.errors, p50: percentile(times, 0.5), p975: percentile(times, 0.975) });
    }
    const ref = results[0].p975;
    const rows = [['route', 'requests', 'non-200', 'p50 ms', 'p97.5 ms', '× /me p97.5', `within ${TARGET_RATIO}×`]];
    for (const r of results) {
      const ratio = r.p975 / ref;
      rows.push([r.name, String(r.requests), String(r.errors), r.p50.toFixed(1), r.p975.toFixed(1), ratio.toFixed(1), r.errors === 0 && ratio <= TARGET_RATIO ? 'ok' : 'NO']);
    }
    process.stdout.write(`\n${bikes.toLocaleString('en')} bikes, ${ids.runCount.toLocaleString('en')} runs in the signed-in shop; ${CONNECTIONS} connections, ${DURATION_S} s per route\n`);
    printTable(rows);
  } finally {
    await app.stop();
  }
}

export async function run(): Promise<void> {
  const pgService = await startLocalPostgres({ baseDir: path.join(STORAGE, 'bench', 'postgres'), port: await freePort(), database: 'pullbook_large', label: 'bench-postgres' });
  try {
    for (const bikes of SIZES) await measureSize(pgService.url, bikes);
  } finally {
    await pgService.stop();
  }
}
