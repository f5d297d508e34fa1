import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { randomBytes } from 'node:crypto';
import { loadConfig } from '../../server/config/env.js';
import { buildDeps } from '../../server/main.js';
import { createApp } from '../../server/app.js';

type Deps = Awaited<ReturnType<typeof buildDeps>>;

export interface BenchApp {
  baseUrl: string;
  deps: Deps;
  /** Waits (up to 10 s) for requests still running, e.g. those autocannon abandoned at the end of a case. */
  settle: () => Promise<void>;
  close: () => Promise<void>;
}

/**
 * The real app on a free loopback port against the given database, without S3 or SMTP (and,
 * given `clientDir`, serving that built client).
 * `prepare` runs on the dependencies before the app is created (e.g. migrations).
 */
export async function startBenchApp(options: { databaseUrl: string; poolMax: number; prepare?: (deps: Deps) => Promise<unknown>; clientDir?: string }): Promise<BenchApp> {
  const server = http.createServer();
  try {
    await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
    const baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    const config = loadConfig({
      ...process.env,
      NODE_ENV: 'test',
      DATABASE_URL: options.databaseUrl,
      SMTP_URL: 'smtp://127.0.0.1:9',
      S3_ENDPOINT: 'http://127.0.0.1:9',
      SESSION_SECRET: randomBytes(24).toString('hex'),
      PUBLIC_URL: baseUrl,
    });
    const deps = await buildDeps(config, { poolMax: options.poolMax });
    if (options.prepare) await options.prepare(deps);
    const created = createApp(deps, { clientDir: options.clientDir });
    // Abandoned requests still run to their end; count them until the response is finished, not
    // until the socket closes, so the next case and the shutdown wait for them.
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
    const close = async () => {
      // Let requests left in flight finish before the pool closes.
      await settle();
      await new Promise<void>((r) => server.close(() => r()));
      server.closeAllConnections();
      await created.close();
      await deps.orm.close();
    };
    return { baseUrl, deps, settle, close };
  } catch (e) {
    server.close();
    throw e;
  }
}

/** Signs in through the API and returns the session cookie header. */
export async function signIn(baseUrl: string, email: string, password: string): Promise<string> {
  const login = await fetch(`${baseUrl}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json', origin: baseUrl }, body: JSON.stringify({ email, password }) });
  if (login.status !== 200) throw new Error(`sign-in failed: ${login.status}`);
  return (login.headers.getSetCookie?.() ?? [login.headers.get('set-cookie') ?? '']).map((c) => c.split(';')[0]).join('; ');
}
