/**
 * Upload bench: one POST /api/runs with 20 files of 5 000 rows each (synthetic runs), through the
 * whole pipeline (multer → S3 fake → analysis → PostgreSQL), timed over a few iterations; target
 * median under 1.5 s per request. Self-contained: starts its own PostgreSQL cluster (under
 * storage/bench/) and S3 fake on free ports, and removes both at the end.
 */
import fs from 'node:fs';
import path from 'node:path';
import supertest from 'supertest';
import { STORAGE } from '../scripts/lib/paths';
import { freePort, startLocalPostgres, startS3Fake, type RunningService } from '../scripts/lib/local-services';
import { loadConfig } from '../server/config/env';
import { buildDeps } from '../server/main';
import { initOrm, migrateToLatest } from '../server/db/orm';
import { createApp } from '../server/app';
import { hashPassword } from '../server/modules/auth/auth.service';
import { Shop } from '../server/modules/shops/shop.entity';
import { User } from '../server/modules/users/user.entity';
import { Customer } from '../server/modules/customers/customer.entity';
import { Bike } from '../server/modules/bikes/bike.entity';
import { syntheticRunFile } from '../server/db/synthetic-runs';
import { printTable } from './lib/table';

const FILES = 20;
const ROWS = 5_000;
const ITERATIONS = 5;
const TARGET_MS = 1_500;

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

export async function run(): Promise<void> {
  process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true';
  const dir = path.join(STORAGE, 'bench', `upload-${process.pid}-${Date.now().toString(36)}`);
  const started: RunningService[] = [];
  try {
    const pg = await startLocalPostgres({ baseDir: path.join(dir, 'postgres'), port: await freePort(), database: 'pullbook_bench', label: `bench-postgres-${process.pid}` });
    started.push(pg);
    const s3 = await startS3Fake({ dir: path.join(dir, 's3'), port: await freePort(), bucket: 'pullbook-bench' });
    started.push(s3);
    const orm = await initOrm(pg.url);
    await migrateToLatest(orm);
    await orm.close();

    const config = loadConfig({
      DATABASE_URL: pg.url,
      S3_ENDPOINT: s3.url,
      S3_BUCKET: 'pullbook-bench',
      S3_ACCESS_KEY_ID: s3.accessKeyId,
      S3_SECRET_ACCESS_KEY: s3.secretAccessKey,
      SMTP_URL: 'smtp://127.0.0.1:1',
      SESSION_SECRET: 'bench-secret-bench-secret-bench-secret-0123',
      NODE_ENV: 'test',
    });
    const deps = await buildDeps(config);
    const app = createApp(deps);
    try {
      const em = deps.orm.em.fork();
      const shop = em.create(Shop, { name: 'Bench Shop' } as Shop);
      const customer = em.create(Customer, { shop, name: 'Bench Rider' } as Customer);
      const bike = em.create(Bike, { shop, customer, make: 'Benchmake', model: 'One' } as Bike);
      em.create(User, { shop, email: 'tuner@bench.test', name: 'Bench Tuner', role: 'tuner', passwordHash: await hashPassword('bench-password-1', 10) } as User);
      await em.flush();
      const agent = supertest.agent(app.app);
      const login = await agent.post('/api/auth/login').send({ email: 'tuner@bench.test', password: 'bench-password-1' });
      if (login.status !== 200) throw new Error(`sign-in failed: ${login.status}`);

      const times: number[] = [];
      let bytesPerRequest = 0;
      // One warm-up request (connections, JIT), then the timed ones; new seeds every time so no file is a duplicate.
      for (let it = 0; it <= ITERATIONS; it++) {
        const files = Array.from({ length: FILES }, (_, i) => Buffer.from(syntheticRunFile({ seed: 10_000 + it * 100 + i, totalRows: ROWS }).bytes));
        bytesPerRequest = files.reduce((n, f) => n + f.length, 0);
        let req = agent.post('/api/runs').field('bikeId', bike.id);
        files.forEach((f, i) => (req = req.attach('files', f, { filename: `bench-${it}-${i}.csv`, contentType: 'text/csv' })));
        const t0 = performance.now();
        const res = await req;
        const ms = performance.now() - t0;
        if (res.status !== 201) throw new Error(`upload answered ${res.status}: ${JSON.stringify(res.body).slice(0, 300)}`);
        const ok = (res.body.results as { ok: boolean }[]).filter((r) => r.ok).length;
        if (ok !== FILES) throw new Error(`only ${ok} of ${FILES} files were read`);
        if (it > 0) times.push(ms);
      }
      const med = median(times);
      const rows = [
        ['case', 'files', 'rows/file', 'MB/request', 'iterations', 'min ms', 'median ms', 'max ms', 'target'],
        [
          'POST /api/runs',
          String(FILES),
          String(ROWS),
          (bytesPerRequest / 1e6).toFixed(1),
          String(times.length),
          Math.min(...times).toFixed(0),
          med.toFixed(0),
          Math.max(...times).toFixed(0),
          med < TARGET_MS ? `ok (< ${TARGET_MS} ms)` : `OVER ${TARGET_MS} ms`,
        ],
      ];
      printTable(rows);
    } finally {
      await app.close();
      await deps.orm.close();
    }
  } finally {
    for (const s of started.reverse()) await s.stop().catch(() => undefined);
    fs.rmSync(dir, { recursive: true, force: true });
  }
}
