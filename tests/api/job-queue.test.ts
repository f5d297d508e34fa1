/**
 * The durable job queue on the test run's real PostgreSQL: with two queue instances (two app
 * processes) on one database, every job is handled exactly once; a failing job is retried with
 * growing delays until it succeeds; a job queued while no worker runs is done once one starts.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomBytes } from 'node:crypto';
import { Writable } from 'node:stream';
import pg from 'pg';
import { JobQueue } from '@server/lib/jobs/job-queue';
import { createLogger } from '@server/lib/logger';

const logger = createLogger({ destination: new Writable({ write: (_c, _e, done) => done() }) });
const template = process.env.TEST_DATABASE_TEMPLATE_URL;
let url = '';
const dbName = `pbq_${randomBytes(5).toString('hex')}`;
const fast = { mail: { retryDelay: 1, retryBackoff: true, retryLimit: 5 } };

async function admin<T>(fn: (c: pg.Client) => Promise<T>): Promise<T> {
  const c = new pg.Client({ connectionString: template!.replace(/\/[^/]+$/, '/postgres') });
  await c.connect();
  try {
    return await fn(c);
  } finally {
    await c.end();
  }
}

beforeAll(async () => {
  if (!template) throw new Error('run with `npm test`, which starts the test PostgreSQL');
  await admin((c) => c.query(`create database "${dbName}" template pullbook_template`));
  url = template.replace(/\/[^/]+$/, `/${dbName}`);
});
afterAll(async () => {
  await admin((c) => c.query(`drop database if exists "${dbName}"`)).catch(() => undefined);
});

async function waitFor(cond: () => boolean, what: string, ms = 30_000) {
  const t0 = Date.now();
  while (!cond()) {
    if (Date.now() - t0 > ms) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

describe('job queue', () => {
  it('starts when several instances set up an empty queue schema at the same moment', async () => {
    // Two app processes booting together both create the queues; without a lock around that,
    // PostgreSQL resolves their deadlock by aborting one, which then failed to start.
    for (let round = 0; round < 4; round++) {
      const schema = `pgboss_race_${round}`;
      const starts = await Promise.allSettled(
        Array.from({ length: 4 }, () => JobQueue.start({ connectionString: url, logger, retry: fast, schema })),
      );
      const failures = starts.filter((s) => s.status === 'rejected').map((s) => String((s as PromiseRejectedResult).reason));
      await Promise.all(starts.map((s) => (s.status === 'fulfilled' ? s.value.stop() : undefined)));
      expect(failures).toEqual([]);
    }
  });

  it('hands each job to exactly one of two instances', async () => {
    const a = await JobQueue.start({ connectionString: url, logger, pollingIntervalSeconds: 0.5, retry: fast });
    const b = await JobQueue.start({ connectionString: url, logger, pollingIntervalSeconds: 0.5, retry: fast });
    try {
      const seen: { n: number; by: string }[] = [];
      await a.work<{ n: number }>('mail', async (d) => void seen.push({ n: d.n, by: 'a' }));
      await b.work<{ n: number }>('mail', async (d) => void seen.push({ n: d.n, by: 'b' }));
      for (let n = 0; n < 30; n++) await (n % 2 ? a : b).send('mail', { n });
      await waitFor(() => seen.length >= 30, 'all 30 jobs');
      await new Promise((r) => setTimeout(r, 1500)); // a second handling would show up by now
      expect(seen).toHaveLength(30);
      expect(new Set(seen.map((s) => s.n)).size).toBe(30);
    } finally {
      await a.stop();
      await b.stop();
    }
  });

  it('retries a failing job with growing delays until it succeeds', async () => {
    const q = await JobQueue.start({ connectionString: url, logger, pollingIntervalSeconds: 0.5, retry: fast });
    try {
      const tries: { at: number; retryCount: number }[] = [];
      await q.work<{ id: string }>('mail', async (_d, job) => {
        tries.push({ at: Date.now(), retryCount: job.retryCount });
        if (tries.length < 3) throw new Error('relay is down');
      });
      const id = (await q.send('mail', { id: 'x' }))!;
      await waitFor(() => tries.length >= 3, 'three tries');
      expect(tries.map((t) => t.retryCount)).toEqual([0, 1, 2]);
      // retryDelay 1 s with backoff: the second wait is longer than the first (pg-boss doubles it).
      const gap1 = tries[1].at - tries[0].at;
      const gap2 = tries[2].at - tries[1].at;
      expect(gap1).toBeGreaterThanOrEqual(900);
      expect(gap2).toBeGreaterThan(gap1);
      let state: string | null = null;
      for (let i = 0; i < 20 && state !== 'completed'; i++) {
        state = await q.state('mail', id);
        await new Promise((r) => setTimeout(r, 200));
      }
      expect(state).toBe('completed');
    } finally {
      await q.stop();
    }
  });

  it('keeps a job queued while no worker runs, and a later worker does it', async () => {
    const sender = await JobQueue.start({ connectionString: url, logger, retry: fast });
    await sender.send('mail', { n: 99 });
    await sender.stop();
    const worker = await JobQueue.start({ connectionString: url, logger, pollingIntervalSeconds: 0.5, retry: fast });
    try {
      const got: number[] = [];
      await worker.work<{ n: number }>('mail', async (d) => void got.push(d.n));
      await waitFor(() => got.includes(99), 'the job queued earlier');
    } finally {
      await worker.stop();
    }
  });
});
