/**
 * The production entry (server/index.ts) as a child process on a database of a test's own, for
 * tests that kill it (SIGKILL) or run several app instances side by side.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import net from 'node:net';
import path from 'node:path';

export interface ChildApp {
  url: string;
  proc: ChildProcess;
  /** Everything the child wrote (pino JSON lines and anything else). */
  output(): string;
  /** SIGKILL, then wait for the exit. */
  kill(): Promise<void>;
  /** SIGTERM (a clean stop), then wait for the exit. */
  stop(): Promise<void>;
}

export async function freePort(): Promise<number> {
  const srv = net.createServer();
  await new Promise<void>((r) => srv.listen(0, '127.0.0.1', () => r()));
  const port = (srv.address() as net.AddressInfo).port;
  await new Promise<void>((r) => srv.close(() => r()));
  return port;
}

export async function startChildApp(env: Record<string, string>, timeoutMs = 60_000): Promise<ChildApp> {
  const port = await freePort();
  const url = `http://127.0.0.1:${port}`;
  const proc = spawn(process.execPath, ['--import', 'tsx', path.resolve('server/index.ts')], {
    env: { ...process.env, HOST: '127.0.0.1', PORT: String(port), PUBLIC_URL: url, LOG_LEVEL: 'info', MAIL_POLL_SECONDS: '0.5', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  proc.stdout!.on('data', (d: Buffer) => (out += d.toString()));
  proc.stderr!.on('data', (d: Buffer) => (out += d.toString()));
  const exited = new Promise<void>((r) => proc.once('exit', () => r()));
  const t0 = Date.now();
  while (!/"msg":"listening"/.test(out)) {
    if (proc.exitCode !== null) throw new Error(`the app exited before listening:\n${out}`);
    if (Date.now() - t0 > timeoutMs) {
      proc.kill('SIGKILL');
      throw new Error(`the app did not listen within ${timeoutMs} ms:\n${out}`);
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  return {
    url,
    proc,
    output: () => out,
    async kill() {
      if (proc.exitCode === null) proc.kill('SIGKILL');
      await exited;
    },
    async stop() {
      if (proc.exitCode === null) proc.kill('SIGTERM');
      await exited;
    },
  };
}

/** A cookie-keeping fetch against one child (or, with `as`, the same cookie against another). */
export function client(baseUrl: string) {
  let cookie = '';
  const call = async (method: string, p: string, body?: unknown, at = baseUrl) => {
    const res = await fetch(`${at}${p}`, {
      method,
      headers: { ...(cookie ? { cookie } : {}), ...(body instanceof FormData ? {} : body !== undefined ? { 'content-type': 'application/json' } : {}), origin: at },
      body: body instanceof FormData ? body : body !== undefined ? JSON.stringify(body) : undefined,
    });
    const set = res.headers.getSetCookie?.() ?? [];
    if (set.length) cookie = set.map((c) => c.split(';')[0]).join('; ');
    const text = await res.text();
    let json: unknown = null;
    try {
      json = text ? JSON.parse(text) : null;
    } catch {
      json = text;
    }
    return { status: res.status, body: json as Record<string, unknown> & { error?: { code: string } } };
  };
  return {
    get: (p: string, at?: string) => call('GET', p, undefined, at),
    post: (p: string, body?: unknown, at?: string) => call('POST', p, body, at),
    get cookie() {
      return cookie;
    },
  };
}
