/**
 * Local stand-ins for the hosted services, on loopback only: a project-local PostgreSQL cluster
 * (Debian's packages), the S3 fake (s3rver) and an SMTP fake that keeps every message as an
 * .eml file. `npm start` and `npm test` use these; a deployment sets DATABASE_URL, S3_ENDPOINT
 * and SMTP_URL instead and none of this runs.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { createHash, randomBytes } from 'node:crypto';
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import pg from 'pg';
import S3rver from 's3rver';
import { SMTPServer } from 'smtp-server';

export interface RunningService {
  url: string;
  stop(): Promise<void>;
}

const log = (msg: string) => console.log(`[services] ${msg}`);

function findPostgresBinDir(): string | undefined {
  const root = '/usr/lib/postgresql';
  if (!fs.existsSync(root)) return undefined;
  const versions = fs
    .readdirSync(root)
    .filter((v) => fs.existsSync(path.join(root, v, 'bin', 'postgres')))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length ? path.join(root, versions[0], 'bin') : undefined;
}

/** Debian package names are the only thing fetched; runs apt-get once when something is missing. */
export function ensureDebianPackages(packages: { name: string; present: () => boolean }[]): void {
  const missing = packages.filter((p) => !p.present()).map((p) => p.name);
  if (!missing.length) return;
  if (process.getuid?.() !== 0) {
    throw new Error(`Missing system packages: ${missing.join(', ')}. Install them with: sudo apt-get install -y ${missing.join(' ')}`);
  }
  log(`installing Debian packages: ${missing.join(', ')} (first run only)`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  execFileSync('apt-get', ['update', '-q'], { stdio: 'inherit', env });
  execFileSync('apt-get', ['install', '-y', '-q', '--no-install-recommends', ...missing], { stdio: 'inherit', env });
}

export function ensurePostgresInstalled(): string {
  ensureDebianPackages([{ name: 'postgresql', present: () => Boolean(findPostgresBinDir()) }]);
  const bin = findPostgresBinDir();
  if (!bin) throw new Error('PostgreSQL binaries not found under /usr/lib/postgresql/*/bin after install');
  return bin;
}

const isRoot = () => process.getuid?.() === 0;

/** Run a PostgreSQL binary; as root it runs as the `postgres` system user, which PostgreSQL requires. */
function runPg(bin: string, args: string[], opts: { quiet?: boolean } = {}) {
  const [cmd, cmdArgs] = isRoot() ? ['runuser', ['-u', 'postgres', '--', bin, ...args]] : [bin, args];
  const res = spawnSync(cmd, cmdArgs, { encoding: 'utf8', cwd: '/' });
  if (res.status !== 0 && !opts.quiet) {
    throw new Error(`${path.basename(bin)} failed (${res.status}): ${res.stderr || res.stdout}`);
  }
  return res;
}

/** Can the postgres user reach and write into dir? Fails when a parent folder is closed to it. */
function postgresUserCanUse(dir: string): boolean {
  if (!isRoot()) return true;
  return spawnSync('runuser', ['-u', 'postgres', '--', 'test', '-w', dir, '-a', '-x', dir]).status === 0;
}

function chownToPostgres(dir: string) {
  if (isRoot()) execFileSync('chown', ['-R', 'postgres:postgres', dir]);
}

export interface PostgresOptions {
  /** Preferred home of the cluster, e.g. storage/postgres. */
  baseDir: string;
  port: number;
  database: string;
  /** Name used for the fallback folder when baseDir is out of the postgres user's reach. */
  label: string;
}

/** Pick a folder the postgres user can use: the preferred one, or a per-checkout one under /var/tmp. */
function choosePostgresHome(opts: PostgresOptions): string {
  fs.mkdirSync(opts.baseDir, { recursive: true });
  chownToPostgres(opts.baseDir);
  if (postgresUserCanUse(opts.baseDir)) return opts.baseDir;
  const checkoutHash = createHash('sha1').update(path.resolve(opts.baseDir)).digest('hex').slice(0, 10);
  const fallback = path.join('/var/tmp', `pullbook-${checkoutHash}`, opts.label);
  fs.mkdirSync(fallback, { recursive: true });
  fs.chmodSync(path.dirname(fallback), 0o755);
  chownToPostgres(fallback);
  log(`the postgres user cannot enter ${opts.baseDir} (a parent folder is closed to it); using ${fallback} instead`);
  return fallback;
}

async function assertPortFree(port: number, what: string) {
  await new Promise<void>((resolve, reject) => {
    const srv = net.createServer();
    srv.once('error', () => reject(new Error(`Port ${port} on 127.0.0.1 is in use; ${what} needs it. Stop the other process or choose another port.`)));
    srv.listen(port, '127.0.0.1', () => srv.close(() => resolve()));
  });
}

/** Ask the OS for a free loopback port. */
export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as net.AddressInfo;
      srv.close(() => resolve(port));
    });
  });
}

/**
 * Start (creating on first use) a project-local PostgreSQL cluster and make sure the database
 * exists. A second start reuses the cluster and its data.
 */
export async function startLocalPostgres(opts: PostgresOptions): Promise<RunningService & { dataDir: string }> {
  const bin = ensurePostgresInstalled();
  const home = choosePostgresHome(opts);
  const dataDir = path.join(home, 'data');
  const logFile = path.join(home, 'server.log');
  const user = 'pullbook';
  // Unix socket paths are limited to ~107 bytes; fall back to /tmp for deep checkouts.
  const socketDir = home.length < 80 ? home : '/tmp';

  if (!fs.existsSync(path.join(dataDir, 'PG_VERSION'))) {
    log(`creating PostgreSQL cluster in ${dataDir}`);
    fs.mkdirSync(dataDir, { recursive: true });
    chownToPostgres(home);
    runPg(path.join(bin, 'initdb'), ['-D', dataDir, '--auth=trust', '-U', user, '-E', 'UTF8', '--locale=C.UTF-8']);
  }

  const running = runPg(path.join(bin, 'pg_ctl'), ['-D', dataDir, 'status'], { quiet: true }).status === 0;
  if (!running) {
    await assertPortFree(opts.port, 'PostgreSQL');
    runPg(path.join(bin, 'pg_ctl'), [
      '-D', dataDir, '-l', logFile, '-w', '-t', '60',
      '-o', `-p ${opts.port} -k ${socketDir} -c listen_addresses=127.0.0.1`,
      'start',
    ]);
  }
  log(`PostgreSQL on 127.0.0.1:${opts.port} (data ${dataDir})`);

  const adminUrl = `postgres://${user}@127.0.0.1:${opts.port}/postgres`;
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  try {
    const exists = await client.query('select 1 from pg_database where datname = $1', [opts.database]);
    if (!exists.rowCount) await client.query(`create database "${opts.database}"`);
  } finally {
    await client.end();
  }

  return {
    url: `postgres://${user}@127.0.0.1:${opts.port}/${opts.database}`,
    dataDir,
    async stop() {
      runPg(path.join(bin, 'pg_ctl'), ['-D', dataDir, '-m', 'fast', '-w', 'stop'], { quiet: true });
      log('PostgreSQL stopped');
    },
  };
}

/** s3rver on loopback with its files under dir; the bucket is created on start. */
export async function startS3Fake(opts: { dir: string; port: number; bucket: string }): Promise<RunningService & { accessKeyId: string; secretAccessKey: string }> {
  fs.mkdirSync(opts.dir, { recursive: true });
  await assertPortFree(opts.port, 'the S3 fake');
  const server = new S3rver({
    address: '127.0.0.1',
    port: opts.port,
    directory: opts.dir,
    silent: true,
    configureBuckets: [{ name: opts.bucket, configs: [] }],
  });
  await server.run();
  log(`S3 fake on 127.0.0.1:${opts.port} (files in ${opts.dir}, bucket ${opts.bucket})`);
  return {
    url: `http://127.0.0.1:${opts.port}`,
    // s3rver accepts this fixed development key pair.
    accessKeyId: 'S3RVER',
    secretAccessKey: 'S3RVER',
    async stop() {
      await server.close();
    },
  };
}

/** An SMTP server that accepts everything and keeps each message as an .eml file in dir. */
export async function startSmtpFake(opts: { dir: string; port: number }): Promise<RunningService> {
  fs.mkdirSync(opts.dir, { recursive: true });
  await assertPortFree(opts.port, 'the SMTP fake');
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    size: 30 * 1024 * 1024,
    onData(stream, _session, callback) {
      const name = `${new Date().toISOString().replace(/[:.]/g, '-')}-${randomBytes(4).toString('hex')}.eml`;
      const tmp = path.join(opts.dir, `.${name}.part`);
      const out = fs.createWriteStream(tmp);
      stream.pipe(out);
      out.on('finish', () => {
        fs.renameSync(tmp, path.join(opts.dir, name));
        callback();
      });
      out.on('error', (err) => callback(err));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port, '127.0.0.1', () => resolve());
  });
  log(`SMTP fake on 127.0.0.1:${opts.port} (messages kept in ${opts.dir})`);
  return {
    url: `smtp://127.0.0.1:${opts.port}`,
    async stop() {
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}

/**
 * The local payment service (payment-fake.ts): the official SDK reaches it through
 * PAYMENTS_API_URL, so the app's code is the same as against the provider. State in dir.
 */
export async function startPaymentService(opts: { dir: string; port: number; secretKey: string; webhookSecret: string; webhookUrl?: string }): Promise<RunningService> {
  await assertPortFree(opts.port, 'the payment fake');
  const { startPaymentFake } = await import('./payment-fake');
  const fake = await startPaymentFake(opts);
  log(`payment fake on 127.0.0.1:${opts.port} (state in ${opts.dir}${opts.webhookUrl ? `, webhooks to ${opts.webhookUrl}` : ''})`);
  return { url: fake.url, stop: () => fake.stop() };
}
