/**
 * Durable background jobs in PostgreSQL (pg-boss), for work that must not be lost when a process
 * dies or a service is away: outgoing mail first. Jobs live in the database the app already uses
 * (schema `pgboss`), so every app instance behind a load balancer shares one queue and each job is
 * handed to exactly one worker at a time; a failed job is retried with exponential backoff.
 */
import PgBoss from 'pg-boss';
import pg from 'pg';
import type { Logger } from 'pino';

/** Each queue's retry rule. Delays double from `retryDelay` seconds (pg-boss `retryBackoff`). */
export const QUEUES = {
  /** One e-mail; the handler checks the send log first, so a retried job never sends twice. */
  mail: { name: 'mail-send', retryLimit: 8, retryDelay: 15, retryBackoff: true, expireInSeconds: 120 },
  /**
   * Account look-ups whose answer must not depend on whether the account exists (a password
   * reset request): the route only queues the job, the job finds the account and queues its mail.
   */
  accountMail: { name: 'account-mail', retryLimit: 5, retryDelay: 5, retryBackoff: true, expireInSeconds: 60 },
} as const satisfies Record<string, PgBoss.Queue>;

export type QueueName = keyof typeof QUEUES;

export interface JobInfo {
  id: string;
  /** 0 on the first try. */
  retryCount: number;
  /** Retries allowed after the first try; the try with retryCount === retryLimit is the last. */
  retryLimit: number;
}

export interface JobQueueOptions {
  connectionString: string;
  logger: Logger;
  /** How often an idle worker looks for work (pg-boss allows 0.5 s and more). */
  pollingIntervalSeconds?: number;
  /** Overrides of the retry rules (tests use short delays). */
  retry?: Partial<Record<QueueName, Partial<PgBoss.Queue>>>;
  /** PostgreSQL schema holding the queue tables; `pgboss` unless a test wants an empty one. */
  schema?: string;
}

export class JobQueue {
  private constructor(
    private readonly boss: PgBoss,
    private readonly opts: JobQueueOptions,
  ) {}

  static async start(opts: JobQueueOptions): Promise<JobQueue> {
    const schema = opts.schema ?? 'pgboss';
    const boss = new PgBoss({ connectionString: opts.connectionString, schema, max: 3, application_name: 'pullbook-jobs' });
    // Without a listener a lost connection would be an unhandled 'error' event and end the process.
    boss.on('error', (err) => opts.logger.error({ err }, 'job queue error'));
    // Two instances booting together would both create the queues, and pg-boss's create_queue
    // deadlocks against itself (each inserts a queue row, then alters the shared job table).
    // A session advisory lock on a connection of our own lets one instance set up at a time.
    await withSetupLock(opts.connectionString, schema, async () => {
      await boss.start();
      for (const [key, rule] of Object.entries(QUEUES) as [QueueName, PgBoss.Queue][]) {
        const queue = { ...rule, ...opts.retry?.[key] };
        if (!(await boss.getQueue(queue.name))) await boss.createQueue(queue.name, queue);
        await boss.updateQueue(queue.name, queue);
      }
    });
    return new JobQueue(boss, opts);
  }

  /** Queues a job; with `singletonKey`, a second job with the same key is not queued while the first waits. */
  async send<T extends object>(queue: QueueName, data: T, options: { singletonKey?: string; startAfterSeconds?: number } = {}): Promise<string | null> {
    return this.boss.send(QUEUES[queue].name, data, { singletonKey: options.singletonKey, startAfter: options.startAfterSeconds });
  }

  /** Runs `handler` for each job of the queue; a throw marks the try failed and schedules a retry. */
  async work<T extends object>(queue: QueueName, handler: (data: T, job: JobInfo) => Promise<void>): Promise<string> {
    return this.boss.work<T>(QUEUES[queue].name, { batchSize: 1, pollingIntervalSeconds: this.opts.pollingIntervalSeconds ?? 2, includeMetadata: true }, async ([job]) => {
      await handler(job.data, { id: job.id, retryCount: job.retryCount, retryLimit: job.retryLimit });
    });
  }

  /** The state of one job (created, retry, active, completed, failed…), for send logs and tests. */
  async state(queue: QueueName, id: string): Promise<string | null> {
    const job = await this.boss.getJobById(QUEUES[queue].name, id);
    return job?.state ?? null;
  }

  async stop(): Promise<void> {
    await this.boss.stop({ graceful: true, wait: true, timeout: 10_000 });
  }
}

/** Runs `fn` while holding a PostgreSQL session advisory lock named after the queue schema. */
async function withSetupLock(connectionString: string, schema: string, fn: () => Promise<void>): Promise<void> {
  const client = new pg.Client({ connectionString, application_name: 'pullbook-jobs-setup' });
  client.on('error', () => undefined); // a lost connection surfaces as the failed query below
  await client.connect();
  const key = `pullbook.job-queue-setup.${schema}`;
  try {
    await client.query('select pg_advisory_lock(hashtext($1))', [key]);
    await fn();
  } finally {
    // Ending the session releases the lock even if the unlock itself fails.
    await client.query('select pg_advisory_unlock(hashtext($1))', [key]).catch(() => undefined);
    await client.end().catch(() => undefined);
  }
}
