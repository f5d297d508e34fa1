import http from "node:http";
import type { AppConfig } from "./config/env";
import type { AppDeps } from "./app-deps";
import { initOrm, migrateToLatest } from "./db/orm";
import { createS3ObjectStore } from "./lib/storage/object-store";
import { journalWrites } from "./lib/storage/journaled-store";
import { reconcileOrphanObjects } from "./modules/runs/orphan-reconcile";
import { createSmtpMailer } from "./lib/mail/mailer";
import { createOutbox } from "./lib/mail/outbox";
import { MailQueue } from "./lib/mail/mail-queue";
import { accountMailWorker } from "./modules/auth/account-mail";
import { createApp } from "./app";
import { runStartupTasks } from "./startup";
import { STARTUP_TASKS } from "./startup-tasks";
import { useNamedStatements } from "./db/prepared-query";
import { logger } from "./lib/logger";

/** Connect to the database, object storage and mail relay named by the config. */
export async function buildDeps(
  config: AppConfig,
  opts: { poolMax?: number } = {},
): Promise<AppDeps> {
  useNamedStatements(config.DATABASE_NAMED_STATEMENTS);
  const orm = await initOrm(config.DATABASE_URL, opts);
  const storage = journalWrites(
    createS3ObjectStore({
      endpoint: config.S3_ENDPOINT,
      region: config.S3_REGION,
      bucket: config.S3_BUCKET,
      accessKeyId: config.S3_ACCESS_KEY_ID,
      secretAccessKey: config.S3_SECRET_ACCESS_KEY,
      forcePathStyle: config.S3_FORCE_PATH_STYLE,
    }),
    orm,
  );
  const mailer = createSmtpMailer(config.SMTP_URL, config.MAIL_FROM);
  const smtp = new URL(config.SMTP_URL);
  const mail = new MailQueue({
    orm,
    storage,
    mailer,
    connectionString: config.DATABASE_URL,
    logger,
    relayNames: [smtp.hostname, decodeURIComponent(smtp.username)].filter(
      Boolean,
    ),
    pollingIntervalSeconds: config.MAIL_POLL_SECONDS,
    sweepSeconds: config.MAIL_SWEEP_SECONDS,
    retry: {
      mail: {
        retryLimit: config.MAIL_RETRY_LIMIT,
        retryDelay: config.MAIL_RETRY_DELAY_SECONDS,
      },
    },
  });
  return {
    config,
    orm,
    storage,
    mailer,
    outbox: createOutbox(config.MAIL_CAPTURE_DIR),
    mail,
  };
}

/** Starts this instance's background workers: mail, and the account look-ups that end in mail. */
export async function startWorkers(deps: AppDeps): Promise<void> {
  await deps.mail.start([accountMailWorker(deps)]);
  const every = deps.config.RECONCILE_EVERY_SECONDS;
  if (every > 0) {
    // Objects of writes that a crashed process never finished (after the grace time), on every instance; one at a time.
    const timer = setInterval(() => {
      reconcileOrphanObjects(deps).then(
        (r) =>
          r.unfinishedRemoved || r.removed
            ? logger.info(r, "reconciled stored objects")
            : undefined,
        (err: unknown) => logger.warn({ err }, "reconciliation failed"),
      );
    }, every * 1000);
    timer.unref();
    reconcileTimers.set(deps, timer);
  }
}

const reconcileTimers = new WeakMap<AppDeps, NodeJS.Timeout>();

/** Stops what startWorkers started. */
export async function stopWorkers(deps: AppDeps): Promise<void> {
  clearInterval(reconcileTimers.get(deps));
  await deps.mail.stop();
}

export interface RunningServer {
  url: string;
  deps: AppDeps;
  close(): Promise<void>;
}

/** Migrate, run start-up tasks, then listen. */
export async function startServer(
  config: AppConfig,
  opts: {
    clientDir?: string;
    migrate?: boolean;
    beforeListen?: (
      deps: AppDeps,
      app: import("express").Express,
    ) => Promise<void>;
  } = {},
): Promise<RunningServer> {
  const deps = await buildDeps(config);
  if (opts.migrate !== false) {
    const applied = await migrateToLatest(deps.orm);
    if (applied.length)
      logger.info({ migrations: applied }, "applied migrations");
  }
  await runStartupTasks(deps, STARTUP_TASKS);
  await startWorkers(deps);
  const created = createApp(deps, { clientDir: opts.clientDir });
  if (opts.beforeListen) await opts.beforeListen(deps, created.app);
  const server = http.createServer(created.app);
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(config.PORT, config.HOST, () => resolve());
  });
  return {
    url: `http://${config.HOST}:${config.PORT}`,
    deps,
    async close() {
      await new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeAllConnections();
      await created.close();
      await stopWorkers(deps);
      await deps.orm.close();
    },
  };
}
