import { spawn, type ChildProcess } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import path from 'node:path';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');

/** Starts bench/lib/app-child.ts in its own Node process against `databaseUrl`; resolves with its base URL. */
export async function startAppProcess(databaseUrl: string, poolMax = 20): Promise<{ baseUrl: string; stop: () => Promise<void> }> {
  const child: ChildProcess = spawn(process.execPath, ['--import', 'tsx', path.join(ROOT, 'bench', 'lib', 'app-child.ts')], {
    cwd: ROOT,
    env: { ...process.env, DATABASE_URL: databaseUrl, POOL_MAX: String(poolMax), LOG_LEVEL: 'warn' },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  const baseUrl = await new Promise<string>((resolve, reject) => {
    let out = '';
    child.stdout!.on('data', (d: Buffer) => {
      out += d.toString();
      const m = /READY (\S+)/.exec(out);
      if (m) resolve(m[1]);
    });
    child.once('exit', (code) => reject(new Error(`app process exited (${code}) before it was ready`)));
  });
  child.stdout!.resume();
  return {
    baseUrl,
    stop: () =>
      new Promise<void>((resolve) => {
        child.once('exit', () => resolve());
        child.kill('SIGTERM');
        setTimeout(() => child.kill('SIGKILL'), 15_000).unref();
      }),
  };
}
