/**
 * Build finder bench at archive scale: 10 000 bikes / 100 000 runs (server/cli/seed-large.ts) in
 * a PostgreSQL cluster of its own under storage/bench/ (seeded once, reused by later runs), the
 * real app on a free loopback port, and autocannon with 20 concurrent connections for 8 s per
 * case. Latency median and p95 are computed from every response's time.
 * Targets: p95 ≤ 100 ms for search, ≤ 150 ms for "similar".
 */
import http from 'node:http';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import { randomBytes } from 'node:crypto';
import autocannon from 'autocannon';
import pg from 'pg';
import { STORAGE } from '../scripts/lib/paths.js';
import { freePort, startLocalPostgres } from '../scripts/lib/local-services.js';
import { LARGE_SEED_PASSWORD, seedLarge } from '../server/cli/seed-large.js';
import { loadConfig } from '../server/config/env.js';
import { buildDeps } from '../server/main.js';
import { initOrm, migrateToLatest } from '../server/db/orm.js';
import { createApp } from '../server/app.js';

const CONNECTIONS = 20;
const DURATION_S = 8;
const BIKES = 10_000;

interface CaseResult {
  name: string;
  requests: number;
  errors: number;
  medianMs: number;
  p95Ms: number;
  targetMs: number;
}

function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return NaN;
  const h = (sorted.length - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, sorted.length - 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

async function load(name: string, baseUrl: string, cookie: string, paths: string[], targetMs: number): Promise<CaseResult> {
  const times: number[] = [];
  let errors = 0;
  let next = 0;
  await new Promise<void>((resolve, reject) => {
    const instance = autocannon(
      {
        url: baseUrl,
        connections: CONNECTIONS,
        duration: DURATION_S,
        headers: { cookie },
        requests: [{ method: 'GET', setupRequest: (req) => ({ ...req, path: paths[next++ % paths.length] }) }],
      },
      (err) => (err ? reject(err) : resolve()),
    );
    instance.on('response', (_client: unknown, statusCode: number, _bytes: number, responseTime: number) => {
      if (statusCode !== 200) errors += 1;
      times.push(responseTime);
    });
  });
  times.sort((a, b) => a - b);
  return { name, requests: times.length, errors, medianMs: percentile(times, 0.5), p95Ms: percentile(times, 0.95), targetMs };
}

/** Prints the finder bench table. */
export async function run(): Promise<void> {
  const pgService = await startLocalPostgres({ baseDir: path.join(STORAGE, 'bench', 'postgres'), port: await freePort(), database: 'pullbook_large', label: 'bench-postgres' });
  const server = http.createServer();
  let close: (() => Promise<void>) | null = null;
  try {
    const check = new pg.Client({ connectionString: pgService.url });
    await check.connect();
    const have = await check
      .query(`select count(*)::int as n from bike b join shop s on s.id = b.shop_id where s.name like 'Large Seed Shop %'`)
      .then((r) => r.rows[0].n as number)
      .catch(() => 0);
    await check.end();
    // A database seeded by an earlier run may predate the latest migrations (they backfill).
    const orm = await initOrm(pgService.url, { poolMax: 2 });
    try {
      await migrateToLatest(orm);
    } finally {
      await orm.close();
    }
    if (have !== BIKES) {
      process.stdout.write(`seeding ${BIKES} bikes (seed:large)…\n`);
      const r = await seedLarge(pgService.url, { bikes: BIKES });
      process.stdout.write(`seeded ${r.bikes} bikes, ${r.stages} stages, ${r.parts} parts, ${r.runs} runs in ${(r.ms / 1000).toFixed(1)} s\n`);
    }

    await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
    const baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    const config = loadConfig({
      ...process.env,
      NODE_ENV: 'test',
      DATABASE_URL: pgService.url,
      SMTP_URL: 'smtp://127.0.0.1:9',
      S3_ENDPOINT: 'http://127.0.0.1:9',
      SESSION_SECRET: randomBytes(24).toString('hex'),
      PUBLIC_URL: baseUrl,
    });
    const deps = await buildDeps(config, { poolMax: CONNECTIONS });
    const created = createApp(deps);
    // Requests autocannon abandons at the end of a case still run to their end; count them until
    // the response is finished, not until the socket closes, so the next case and the shutdown wait.
    let inFlight = 0;
    server.on('request', (req, res) => {
      inFlight += 1;
      let done = false;
      const end = () => {
        if (done) return;
        done = true;
        inFlight -= 1;
      };
      res.on('finish', end);
      res.on('close', () => (res.writableFinished ? end() : setTimeout(end, 5_000)));
      created.app(req, res);
    });
    const settle = async () => {
      for (let i = 0; i < 200 && inFlight > 0; i++) await new Promise((r) => setTimeout(r, 50));
    };
    close = async () => {
      // Let requests autocannon left in flight finish before the pool closes.
      await settle();
      await new Promise<void>((r) => server.close(() => r()));
      server.closeAllConnections();
      await created.close();
      await deps.orm.close();
    };

    const login = await fetch(`${baseUrl}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'owner1@large.test', password: LARGE_SEED_PASSWORD }) });
    if (login.status !== 200) throw new Error(`sign-in failed: ${login.status}`);
    const cookie = (login.headers.getSetCookie?.() ?? [login.headers.get('set-cookie') ?? '']).map((c) => c.split(';')[0]).join('; ');

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
    const widths = rows[0].map((_, i) => Math.max(...rows.map((row) => row[i].length)));
    for (const row of rows) process.stdout.write(row.map((c, i) => c.padEnd(widths[i])).join('  ') + '\n');
    process.stdout.write(`${CONNECTIONS} concurrent connections, ${DURATION_S} s per case, ${BIKES} bikes / ${BIKES * 10} runs over 4 shops (one shop searched)\n`);
  } finally {
    if (close) await close();
    else server.close();
    await pgService.stop();
  }
}
