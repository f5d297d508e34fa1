/**
 * `npm start`: the whole app on this machine with demo data. Starts a project-local PostgreSQL,
 * the S3 fake and the SMTP fake unless DATABASE_URL / S3_ENDPOINT / SMTP_URL point elsewhere,
 * migrates, seeds the demo shop into an empty database, and serves the built client and the
 * API from one process on 127.0.0.1:${PORT:-3000}. Ctrl-C stops everything it started.
 * `npm run dev` does the same with Vite's hot reload instead of the built client.
 */
import fs from 'node:fs';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import { ROOT, STORAGE } from './lib/paths';
import { startLocalPostgres, startPaymentService, startS3Fake, startSmtpFake, type RunningService } from './lib/local-services';
import { ensureClientBuilt } from './lib/client-build';
import { ConfigError, loadConfig } from '../server/config/env';
import { startServer, type RunningServer } from '../server/main';
import { DEMO_PASSWORD, DEMO_SIGN_INS, seedDemoIfEmpty } from '../server/db/demo-seed';
import '../server/db/demo-archive';

const dev = process.argv.includes('--dev');
const started: RunningService[] = [];
let server: RunningServer | undefined;
let stopping = false;

async function shutdown(code: number) {
  if (stopping) return;
  stopping = true;
  console.log('\n[pullbook] stopping…');
  await server?.close().catch((e) => console.error(e));
  for (const s of started.reverse()) await s.stop().catch((e) => console.error(e));
  process.exit(code);
}
// `on`, not `once`: Ctrl-C reaches npm, tsx and this process alike, and a second SIGINT must not
// kill the shutdown half-way (PostgreSQL would be left running).
process.on('SIGINT', () => void shutdown(0));
process.on('SIGTERM', () => void shutdown(0));

/** A stable secret per checkout, so sessions survive a restart of the local app. */
function localSessionSecret() {
  const file = path.join(STORAGE, 'session-secret');
  if (!fs.existsSync(file)) fs.writeFileSync(file, randomBytes(32).toString('hex'), { mode: 0o600 });
  return fs.readFileSync(file, 'utf8').trim();
}

/** A stable random secret per checkout, kept in storage/<name>. */
function localSecret(name: string, prefix = '') {
  const file = path.join(STORAGE, name);
  if (!fs.existsSync(file)) fs.writeFileSync(file, prefix + randomBytes(24).toString('hex'), { mode: 0o600 });
  return fs.readFileSync(file, 'utf8').trim();
}

async function main() {
  fs.mkdirSync(STORAGE, { recursive: true });
  const env = process.env;
  const port = Number(env.PORT ?? 3000);
  env.PORT = String(port);
  env.PUBLIC_URL ??= `http://127.0.0.1:${port}`;
  env.SESSION_SECRET ??= localSessionSecret();
  env.NODE_ENV ??= dev ? 'development' : 'production';
  // The SDK's notice about Node 20 support is not actionable for a local run.
  env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true';

  if (!env.DATABASE_URL) {
    const pg = await startLocalPostgres({ baseDir: path.join(STORAGE, 'postgres'), port: Number(env.PULLBOOK_PG_PORT ?? 55432), database: 'pullbook', label: 'postgres' });
    started.push(pg);
    env.DATABASE_URL = pg.url;
  }
  if (!env.S3_ENDPOINT) {
    const s3 = await startS3Fake({ dir: path.join(STORAGE, 's3'), port: Number(env.PULLBOOK_S3_PORT ?? 45680), bucket: env.S3_BUCKET ?? 'pullbook' });
    started.push(s3);
    env.S3_ENDPOINT = s3.url;
    env.S3_ACCESS_KEY_ID ??= s3.accessKeyId;
    env.S3_SECRET_ACCESS_KEY ??= s3.secretAccessKey;
  }
  if (!env.SMTP_URL) {
    const mailDir = path.join(STORAGE, 'mail');
    const smtp = await startSmtpFake({ dir: mailDir, port: Number(env.PULLBOOK_SMTP_PORT ?? 25250) });
    started.push(smtp);
    env.SMTP_URL = smtp.url;
    env.MAIL_CAPTURE_DIR ??= mailDir;
  }

  if (!env.PAYMENTS_SECRET_KEY && !env.PAYMENTS_API_URL) {
    const pay = await startPaymentService({
      dir: path.join(STORAGE, 'payments'),
      port: Number(env.PULLBOOK_PAY_PORT ?? 45690),
      secretKey: 'sk_test_pullbook_local',
      webhookSecret: localSecret('payments-webhook-secret', 'whsec_'),
      webhookUrl: `${env.PUBLIC_URL.replace(/\/$/, '')}/api/payments/webhook`,
    });
    started.push(pay);
    env.PAYMENTS_API_URL = pay.url;
    env.PAYMENTS_SECRET_KEY = 'sk_test_pullbook_local';
    env.PAYMENTS_WEBHOOK_SECRET = localSecret('payments-webhook-secret', 'whsec_');
  }

  const config = loadConfig(env);
  if (!dev) ensureClientBuilt();
  server = await startServer(config, {
    clientDir: dev ? undefined : path.join(ROOT, 'dist'),
    beforeListen: async (deps, app) => {
      const seeded = await seedDemoIfEmpty(deps);
      if (seeded) console.log('[pullbook] created the demo shop');
      if (dev) {
        const { createServer } = await import('vite');
        const vite = await createServer({ root: ROOT, server: { middlewareMode: true }, appType: 'spa' });
        app.use(vite.middlewares);
      }
    },
  });

  console.log(`
  Pullbook is running at ${config.PUBLIC_URL}

  Demo sign-ins (password "${DEMO_PASSWORD}"):
${DEMO_SIGN_INS.map((s) => `    ${s.role.padEnd(9)} ${s.email}`).join('\n')}
${config.MAIL_CAPTURE_DIR ? `\n  Mail is captured locally; the owner's Outbox page shows it.` : ''}
  Press Ctrl-C to stop.
`);
}

main().catch(async (err) => {
  console.error(err instanceof ConfigError ? err.message : err);
  await shutdown(1);
});
