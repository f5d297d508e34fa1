/**
 * Build finder bench at archive scale: 10 000 bikes / 100 000 runs (server/cli/seed-large.ts) in
 * a PostgreSQL cluster of its own under storage/bench/ (seeded once, reused by later runs), the
 * real app on a free loopback port, and autocannon with 20 concurrent connections for 8 s per
 * case. Latency median and p95 are computed from every response's time.
 * Targets: p95 ≤ 100 ms for search, ≤ 150 ms for "similar".
 */
import path from 'node:path';
import pg from 'pg';
import { STORAGE } from '../scripts/lib/paths.js';
import { freePort, startLocalPostgres } from '../scripts/lib/local-services.js';
import { LARGE_SEED_PASSWORD } from '../server/cli/seed-large.js';
import { ensureLargeSeed } from './lib/large-seed.js';
import { signIn, startBenchApp, type BenchApp } from './lib/app-server.js';
import { loadTest, type LoadResult } from './lib/load.js';
import { printTable } from './lib/table.js';

const CONNECTIONS = 20;
const DURATION_S = 8;
const BIKES = 10_000;

interface CaseResult extends LoadResult {
  name: string;
  targetMs: number;
}

async function load(name: string, baseUrl: string, cookie: string, paths: string[], targetMs: number): Promise<CaseResult> {
  const result = await loadTest({ url: baseUrl, connections: CONNECTIONS, duration: DURATION_S, headers: { cookie } }, paths);
  return { name, ...result, targetMs };
}

/** Prints the finder bench table. */
export async function run(): Promise<void> {
  const pgService = await startLocalPostgres({ baseDir: path.join(STORAGE, 'bench', 'postgres'), port: await freePort(), database: 'pullbook_large', label: 'bench-postgres' });
  let app: BenchApp | null = null;
  try {
    await ensureLargeSeed(pgService.url, BIKES);

    app = await startBenchApp({ databaseUrl: pgService.url, poolMax: CONNECTIONS });
    const { baseUrl, settle } = app;
    const cookie = await signIn(baseUrl, 'owner1@large.test', LARGE_SEED_PASSWORD);

    const db = new pg.Client({ connectionString: pgService.url });
    await db.connect();
    const bikeIds = (await db.query(`select b.id from bike b join app_user u on u.shop_id = b.shop_id where u.email = 'owner1@large.test' order by b.id limit 50`)).rows.map((r) => r.id as string);
    await db.end();

    const searches = [
      '/api/builds/search?engine=vantor%20103',
      '/api/builds/search?engine=vantr&parts=camshaft,cylinder-heads&headLevel=mild-port',
      '/api/builds/search?ciMin=100&ciMax=110&sort=gain',
      '/api/builds/search?q=pinging&sort=date',
      '/api/builds/search?parts=big-bore&make=corvane',
      '/api/builds/search?partText=valve&cylinders=2&limit=50',
      '/api/builds/search',
    ];
    const similar = bikeIds.map((id) => `/api/bikes/${id}/similar`);
    // Warm-up (connection pool, plan caches).
    for (const p of [...searches, ...similar.slice(0, 5)]) await fetch(baseUrl + p, { headers: { cookie } });

    const searchResult = await load('search (7 filter mixes)', baseUrl, cookie, searches, 100);
    await settle();
    const results = [searchResult, await load('similar (50 bikes)', baseUrl, cookie, similar, 150)];
    const rows = [['case', 'requests', 'non-200', 'median ms', 'p95 ms', 'target p95', 'result']];
    for (const r of results) {
      rows.push([r.name, String(r.requests), String(r.errors), r.medianMs.toFixed(1), r.p95Ms.toFixed(1), `≤ ${r.targetMs} ms`, r.p95Ms <= r.targetMs && r.errors === 0 ? 'ok' : 'OVER TARGET']);
    }
    printTable(rows);
    process.stdout.write(`${CONNECTIONS} concurrent connections, ${DURATION_S} s per case, ${BIKES} bikes / ${BIKES * 10} runs over 4 shops (one shop searched)\n`);
  } finally {
    if (app) await app.close();
    await pgService.stop();
  }
}
