/**
 * The sync agent: watches the dyno PC's run-file folder and sends every new or changed run file
 * to Pullbook once it has stopped growing, including files already there at start-up. Read-only
 * towards the folder: it never changes, moves or deletes the dyno's files. What it sent is kept in
 * a journal outside the folder, so a restart sends nothing twice (the server's per-bike duplicate
 * check is the second guard). While the server or the network is away it retries with backoff, in
 * order, and catches up once it is back.
 */
import { createHash } from 'node:crypto';
import fs from 'node:fs/promises';
import path from 'node:path';
import { watch, type FSWatcher } from 'chokidar';
import { isRunFileName } from '@shared/run-files';
import { Journal } from './journal';
import { backoffDelayMs } from './backoff';
import { FatalSendError, sendHeartbeat, sendRunFile, TokenRefusedError, type SendOutcome } from './sender';

export interface AgentOptions {
  server: string;
  token: string;
  folder: string;
  journalFile: string;
  /** A file counts as finished once its size has not changed for this long. */
  settleMs?: number;
  /** First wait after a failed try; doubles up to `maxBackoffMs`. */
  firstBackoffMs?: number;
  maxBackoffMs?: number;
  /** Poll the folder instead of OS events (network shares, some virtual machines). */
  poll?: boolean;
  /** Tell the server the agent is running this often while idle (the bay board's "last heard"); 0 = never. */
  heartbeatMs?: number;
  /** Where the one-line-per-file results go. */
  log?: (line: string) => void;
}

export type AgentEvent =
  | { kind: 'sent'; file: string; line: string }
  | { kind: 'skipped'; file: string }
  | { kind: 'refused'; file: string; line: string }
  | { kind: 'waiting'; file: string; reason: string; delayMs: number }
  | { kind: 'token-refused'; message: string }
  | { kind: 'fatal'; message: string };

export class SyncAgent {
  private watcher?: FSWatcher;
  private readonly queue: string[] = [];
  private readonly queued = new Set<string>();
  private running = false;
  private draining: Promise<void> = Promise.resolve();
  private stopped = false;
  private wake?: () => void;
  private heartbeat?: NodeJS.Timeout;
  /** Set once the agent stopped for good on a refused token or a fatal answer (reported once). */
  private ended = false;
  private readonly journal: Journal;
  private readonly listeners: ((e: AgentEvent) => void)[] = [];
  /** Settles when the agent stops for good (stop() or a refused token). */
  readonly done: Promise<{ tokenRefused: boolean }>;
  private finish!: (v: { tokenRefused: boolean }) => void;

  constructor(private readonly opts: AgentOptions) {
    this.journal = Journal.open(opts.journalFile, opts.server, path.resolve(opts.folder));
    this.done = new Promise((resolve) => (this.finish = resolve));
  }

  on(listener: (e: AgentEvent) => void) {
    this.listeners.push(listener);
  }

  private emit(e: AgentEvent) {
    for (const l of this.listeners) l(e);
    if ('line' in e) this.opts.log?.(e.line);
  }

  /** Starts watching; resolves once the files already in the folder have been found (not yet sent). */
  async start(): Promise<void> {
    const settle = this.opts.settleMs ?? 1000;
    this.watcher = watch(path.resolve(this.opts.folder), {
      ignoreInitial: false,
      persistent: true,
      usePolling: this.opts.poll ?? false,
      interval: 250,
      awaitWriteFinish: { stabilityThreshold: settle, pollInterval: Math.min(100, settle / 2) },
      ignored: (p, stats) => Boolean(stats?.isFile() && !isRunFileName(p)),
    });
    this.watcher.on('add', (p) => this.enqueue(p));
    this.watcher.on('change', (p) => this.enqueue(p));
    this.watcher.on('error', (err) => this.opts.log?.(`watching the folder failed: ${(err as Error).message}`));
    await new Promise<void>((resolve) => this.watcher!.once('ready', () => resolve()));
    const every = this.opts.heartbeatMs ?? 60_000;
    if (every > 0) {
      const beat = () => void this.beat();
      beat();
      this.heartbeat = setInterval(beat, every);
      this.heartbeat.unref();
    }
  }

  /** One heartbeat while no file is on its way (an upload says the same); a refused token stops the agent. */
  private async beat() {
    if (this.stopped || this.running) return;
    try {
      await sendHeartbeat({ server: this.opts.server, token: this.opts.token });
    } catch (err) {
      if (!(err instanceof TokenRefusedError) || this.stopped || this.ended) return;
      this.ended = true;
      this.emit({ kind: 'token-refused', message: err.message });
      this.stopped = true;
      clearInterval(this.heartbeat);
      this.wake?.();
      await this.watcher?.close();
      await this.draining;
      this.finish({ tokenRefused: true });
    }
  }

  /** Stops watching; an upload already on its way is finished (and journalled) first. */
  async stop(): Promise<void> {
    this.stopped = true;
    clearInterval(this.heartbeat);
    this.wake?.();
    await this.watcher?.close();
    await this.draining;
    this.finish({ tokenRefused: false });
  }

  /** Files waiting to be sent (for tests and the status line). */
  get pending(): number {
    return this.queue.length + (this.running ? 1 : 0);
  }

  private enqueue(absPath: string) {
    if (this.stopped || !isRunFileName(absPath) || this.queued.has(absPath)) return;
    this.queued.add(absPath);
    this.queue.push(absPath);
    if (!this.running) this.draining = this.drain();
  }

  private async drain() {
    this.running = true;
    try {
      while (!this.stopped && this.queue.length) {
        const file = this.queue[0];
        const finished = await this.sendOne(file);
        if (!finished) break;
        this.queue.shift();
        this.queued.delete(file);
      }
    } finally {
      this.running = false;
    }
  }

  /** Sends one file, retrying until it is sent or refused. False when the agent stopped meanwhile. */
  private async sendOne(absPath: string): Promise<boolean> {
    const rel = path.relative(path.resolve(this.opts.folder), absPath) || path.basename(absPath);
    let bytes: Buffer;
    try {
      bytes = await fs.readFile(absPath);
    } catch {
      return true; // gone before it could be read: nothing to send
    }
    const sha256 = createHash('sha256').update(bytes).digest('hex');
    if (this.journal.wasSent(rel, sha256)) {
      this.emit({ kind: 'skipped', file: rel });
      return true;
    }
    for (let attempt = 0; !this.stopped; attempt++) {
      let outcome: SendOutcome;
      try {
        outcome = await sendRunFile({ server: this.opts.server, token: this.opts.token, fileName: path.basename(absPath), bytes });
      } catch (err) {
        if (err instanceof FatalSendError) {
          if (this.ended) return false; // the heartbeat found the token refused first
          this.ended = true;
          this.emit(err instanceof TokenRefusedError ? { kind: 'token-refused', message: err.message } : { kind: 'fatal', message: err.message });
          this.stopped = true;
          clearInterval(this.heartbeat);
          await this.watcher?.close();
          this.finish({ tokenRefused: err instanceof TokenRefusedError });
          return false;
        }
        throw err;
      }
      if (outcome.kind === 'sent') {
        const line = `sent     ${rel} → ${describeSent(outcome.response)}`;
        this.journal.record(rel, { size: bytes.length, sha256, sentAt: new Date().toISOString(), outcome: line });
        this.emit({ kind: 'sent', file: rel, line });
        return true;
      }
      if (outcome.kind === 'refused') {
        // The server read the request and said no (e.g. too large): the same bytes will be refused
        // again, so they are journalled; a changed file is a new version and is tried again.
        const line = `refused  ${rel}: ${outcome.message} (${outcome.code})`;
        this.journal.record(rel, { size: bytes.length, sha256, sentAt: new Date().toISOString(), outcome: line });
        this.emit({ kind: 'refused', file: rel, line });
        return true;
      }
      const delayMs = outcome.retryAfterMs ?? backoffDelayMs(attempt, this.opts.firstBackoffMs ?? 1000, this.opts.maxBackoffMs ?? 60_000);
      this.emit({ kind: 'waiting', file: rel, reason: outcome.reason, delayMs });
      if (attempt === 0 || attempt % 5 === 0) this.opts.log?.(`waiting  ${rel}: ${outcome.reason}; trying again in ${Math.ceil(delayMs / 1000)} s`);
      await new Promise<void>((resolve) => {
        const t = setTimeout(resolve, delayMs);
        this.wake = () => {
          clearTimeout(t);
          resolve();
        };
      });
    }
    return false;
  }
}

/** "2 runs in 2019 Testmake Own (session …)" or "the inbox (nothing on the dyno)". */
export function describeSent(response: import('@shared/schemas/device').DeviceUploadResponse): string {
  const landing = response.landing;
  if (landing.kind === 'inbox') {
    const pulls = `${landing.pulls} pull${landing.pulls === 1 ? '' : 's'}`;
    return landing.duplicate ? `the inbox: already waiting there (${pulls}); nothing new was kept` : `the inbox (nothing was on the dyno): ${pulls}, waiting to be assigned`;
  }
  const where = landing.bikeLabel;
  const ok = response.results.filter((r) => r.ok);
  const dup = ok.filter((r) => r.ok && r.duplicate).length;
  const failed = response.results.length - ok.length;
  const parts = [`${ok.length - dup} new run${ok.length - dup === 1 ? '' : 's'}`];
  if (dup) parts.push(`${dup} already archived`);
  if (failed) parts.push(`${failed} could not be read`);
  const peaks = ok
    .map((r) => (r.ok && r.run.peakPowerHp !== null ? `${r.run.peakPowerHp.toFixed(1)} hp` : null))
    .filter((x): x is string => x !== null);
  return `${where}: ${parts.join(', ')}${peaks.length ? ` (${peaks.join(', ')})` : ''}`;
}
