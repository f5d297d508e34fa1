/**
 * `npm test`: everything CI checks, on real services started for the run (never the demo's):
 * type-check, lint, then vitest — unit, API (real PostgreSQL, S3 fake, SMTP fake) and browser
 * tests (Debian's Chromium). Installs postgresql, poppler-utils and chromium from Debian when
 * missing. Ends with a "N passed, N failed" line.
 */
import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { ROOT, STORAGE } from './lib/paths';
import { ensureDebianPackages, freePort, startLocalPostgres, startPaymentService, startS3Fake, startSmtpFake, type RunningService } from './lib/local-services';
import { buildClient } from './lib/client-build';
import { initOrm, migrateToLatest } from '../server/db/orm';

// Each run gets its own services and folder, so several test runs can share a machine.
const TEST_DIR = path.join(STORAGE, 'test', `run-${Date.now().toString(36)}-${process.pid}`);
const started: RunningService[] = [];
let clusterHome: string | undefined;
const args = process.argv.slice(2);
const only = args.filter((a) => !a.startsWith('--'));
const skipStatic = args.includes('--no-static');

function step(title: string, cmd: string, cmdArgs: string[], env: NodeJS.ProcessEnv = process.env): boolean {
  console.log(`\n=== ${title} ===`);
  const t0 = Date.now();
  const res = spawnSync(cmd, cmdArgs, { cwd: ROOT, stdio: 'inherit', env });
  console.log(`=== ${title}: ${res.status === 0 ? 'ok' : 'FAILED'} (${((Date.now() - t0) / 1000).toFixed(1)} s) ===`);
  return res.status === 0;
}

/** Like step(), but keeps this process's event loop free: the S3 and SMTP fakes run in it. */
function stepAsync(title: string, cmd: string, cmdArgs: string[], env: NodeJS.ProcessEnv): Promise<boolean> {
  console.log(`\n=== ${title} ===`);
  const t0 = Date.now();
  return new Promise((resolve) => {
    const child = spawn(cmd, cmdArgs, { cwd: ROOT, stdio: 'inherit', env });
    child.on('exit', (code) => {
      console.log(`=== ${title}: ${code === 0 ? 'ok' : 'FAILED'} (${((Date.now() - t0) / 1000).toFixed(1)} s) ===`);
      resolve(code === 0);
    });
  });
}

async function stopAll() {
  for (const s of started.reverse()) await s.stop().catch(() => undefined);
  started.length = 0;
  if (!process.env.PULLBOOK_KEEP_TEST_DIR) {
    fs.rmSync(TEST_DIR, { recursive: true, force: true });
    // A cluster that had to live outside the checkout (see startLocalPostgres) goes too.
    if (clusterHome?.startsWith('/var/tmp/pullbook-')) fs.rmSync(path.dirname(clusterHome), { recursive: true, force: true });
  }
}

async function main(): Promise<number> {
  const bin = (name: string) => path.join(ROOT, 'node_modules', '.bin', name);
  let ok = true;
  if (!skipStatic) {
    // Each side on its own (no DOM in the server, no Node in the client, neither in src/shared), then the tests.
    for (const side of ['shared', 'client', 'server']) ok = step(`type-check ${side} (tsconfig.${side}.json)`, bin('tsc'), ['--noEmit', '-p', `tsconfig.${side}.json`]) && ok;
    ok = step('type-check tests (tsconfig.json)', bin('tsc'), ['--noEmit', '-p', 'tsconfig.json']) && ok;
    ok = step('lint (eslint)', bin('eslint'), ['.']) && ok;
  }

  ensureDebianPackages([
    { name: 'postgresql', present: () => fs.existsSync('/usr/lib/postgresql') && fs.readdirSync('/usr/lib/postgresql').some((v) => fs.existsSync(`/usr/lib/postgresql/${v}/bin/postgres`)) },
    { name: 'poppler-utils', present: () => fs.existsSync('/usr/bin/pdftotext') },
    { name: 'chromium', present: () => fs.existsSync('/usr/bin/chromium') },
  ]);

  fs.mkdirSync(TEST_DIR, { recursive: true });
  fs.mkdirSync(path.join(ROOT, 'tests', 'artifacts'), { recursive: true });

  const pg = await startLocalPostgres({ baseDir: path.join(TEST_DIR, 'postgres'), port: await freePort(), database: 'pullbook_template', label: `test-postgres-${process.pid}` });
  started.push(pg);
  clusterHome = path.dirname(pg.dataDir);
  // Each test file clones this migrated template into a database of its own.
  const admin = pg.url.replace(/\/[^/]+$/, '/postgres');
  const pgmod = (await import('pg')).default;
  const client = new pgmod.Client({ connectionString: admin });
  await client.connect();
  await client.end();
  const orm = await initOrm(pg.url);
  await migrateToLatest(orm);
  await orm.close();

  const s3 = await startS3Fake({ dir: path.join(TEST_DIR, 's3'), port: await freePort(), bucket: 'pullbook-test' });
  started.push(s3);
  const mailDir = path.join(TEST_DIR, 'mail');
  const smtp = await startSmtpFake({ dir: mailDir, port: await freePort() });
  started.push(smtp);

  // Payments: tests that need webhooks register their own endpoint with the fake (through the SDK).
  const payments = await startPaymentService({ dir: path.join(TEST_DIR, 'payments'), port: await freePort(), secretKey: 'sk_test_pullbook_tests', webhookSecret: 'whsec_pullbook_tests' });
  started.push(payments);

  // Browser tests need the built client; build it into this run's folder only when they run.
  const clientDir = path.join(TEST_DIR, 'dist');
  const wantsBrowser = only.length === 0 || only.some((f) => f.includes('e2e'));
  if (wantsBrowser) buildClient(clientDir);

  const env: NodeJS.ProcessEnv = {
    ...process.env,
    NODE_ENV: 'test',
    // Request lines would bury the test output; errors are still written.
    LOG_LEVEL: process.env.LOG_LEVEL ?? 'error',
    TEST_DATABASE_TEMPLATE_URL: pg.url,
    S3_ENDPOINT: s3.url,
    S3_BUCKET: 'pullbook-test',
    S3_ACCESS_KEY_ID: s3.accessKeyId,
    S3_SECRET_ACCESS_KEY: s3.secretAccessKey,
    SMTP_URL: smtp.url,
    MAIL_CAPTURE_DIR: mailDir,
    SESSION_SECRET: 'test-secret-test-secret-test-secret-0123456789',
    BCRYPT_ROUNDS: '10',
    AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true',
    PULLBOOK_CLIENT_DIR: clientDir,
    PAYMENTS_API_URL: payments.url,
    PAYMENTS_SECRET_KEY: 'sk_test_pullbook_tests',
    PAYMENTS_WEBHOOK_SECRET: 'whsec_pullbook_tests',
  };
  const resultsFile = path.join(TEST_DIR, 'vitest-results.json');
  fs.rmSync(resultsFile, { force: true });
  ok = (await stepAsync('vitest (unit, API, browser)', bin('vitest'), ['run', '--reporter=default', '--reporter=json', `--outputFile.json=${resultsFile}`, ...only], env)) && ok;

  let passed = 0;
  let failed = 0;
  if (fs.existsSync(resultsFile)) {
    const results = JSON.parse(fs.readFileSync(resultsFile, 'utf8')) as { numPassedTests: number; numFailedTests: number };
    passed = results.numPassedTests;
    failed = results.numFailedTests;
  }
  if (!ok && failed === 0) failed = 1; // a failed static step counts as a failure
  await stopAll();
  console.log(`\ntests: ${passed} passed, ${failed} failed`);
  return ok && passed > 0 ? 0 : 1;
}

main().then(
  (code) => process.exit(code),
  async (err) => {
    console.error(err);
    await stopAll();
    process.exit(1);
  },
);
