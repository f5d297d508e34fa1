/**
 * The real sync agent (`server/cli/sync.ts`, what `npm run sync` runs) as a child process, for the
 * bay-capture browser test and bench: its output lines, a wait for a line, and a clean stop.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');

export interface AgentProcess {
  child: ChildProcess;
  /** Every line printed so far (stdout and stderr), without the time stamp. */
  lines: string[];
  /** performance.now() when each line arrived (same index as `lines`). */
  lineTimes: number[];
  waitForLine(match: RegExp, timeoutMs?: number, from?: number): Promise<string>;
  /** SIGTERM, then the exit code. */
  stop(): Promise<number | null>;
}

export function startAgentProcess(opts: { server: string; token: string; folder: string; journal: string; settleMs?: number }): AgentProcess {
  const args = ['--import', 'tsx', path.join(ROOT, 'server', 'cli', 'sync.ts'), '--server', opts.server, '--token', opts.token, '--journal', opts.journal, '--settle-ms', String(opts.settleMs ?? 1000), opts.folder];
  const child = spawn(process.execPath, args, { cwd: ROOT, env: { ...process.env, AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true' }, stdio: ['ignore', 'pipe', 'pipe'] });
  const lines: string[] = [];
  const lineTimes: number[] = [];
  const waiters = new Set<() => void>();
  const take = (chunk: Buffer) => {
    for (const raw of chunk.toString('utf8').split('\n')) {
      const line = raw.replace(/^\d{4}-\d\d-\d\d \d\d:\d\d:\d\d {2}/, '').trimEnd();
      if (line) {
        lines.push(line);
        lineTimes.push(performance.now());
      }
    }
    for (const w of waiters) w();
  };
  child.stdout!.on('data', take);
  child.stderr!.on('data', take);
  const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
  return {
    child,
    lines,
    lineTimes,
    waitForLine(match, timeoutMs = 20_000, from = 0) {
      return new Promise((resolve, reject) => {
        const check = () => {
          const hit = lines.slice(from).find((l) => match.test(l));
          if (hit !== undefined) {
            waiters.delete(check);
            clearTimeout(timer);
            resolve(hit);
          }
        };
        const timer = setTimeout(() => {
          waiters.delete(check);
          reject(new Error(`the agent printed no line matching ${match} in ${timeoutMs} ms; it printed:\n${lines.join('\n')}`));
        }, timeoutMs);
        waiters.add(check);
        check();
      });
    },
    async stop() {
      if (child.exitCode === null) child.kill('SIGTERM');
      const t = setTimeout(() => child.kill('SIGKILL'), 10_000);
      const code = await exited;
      clearTimeout(t);
      return code;
    },
  };
}
