/**
 * Live run events across app instances: PostgreSQL LISTEN/NOTIFY. A trigger on `run`
 * (Migration20261202180000) sends NOTIFY pullbook_run inside the transaction that stores or changes
 * a run, so PostgreSQL delivers it at commit to every listening connection, whichever instance
 * made the change. Each app instance keeps ONE dedicated listening connection (not from a pool),
 * opened on the first subscriber, with an `error` listener and a reconnect with backoff; after a
 * reconnect every subscriber gets a `resync` (events may have been missed while it was away).
 */
import pg from 'pg';
import { logger } from '../logger';

export const RUN_CHANNEL = 'pullbook_run';

/** One NOTIFY payload of the run trigger. */
export interface RunNotice {
  shopId: string;
  sessionId: string;
  runId: string;
  op: 'insert' | 'update' | 'moved';
}

export type LiveEvent = { kind: 'run'; notice: RunNotice } | { kind: 'resync' };
type Listener = (e: LiveEvent) => void;

export function parseRunNotice(payload: string | undefined): RunNotice | null {
  if (!payload) return null;
  try {
    const v = JSON.parse(payload) as Partial<RunNotice>;
    return typeof v.sessionId === 'string' && typeof v.runId === 'string' && typeof v.shopId === 'string' ? (v as RunNotice) : null;
  } catch {
    return null;
  }
}

export class LiveFeed {
  private client: pg.Client | null = null;
  private readonly bySession = new Map<string, Set<Listener>>();
  private started = false;
  private closed = false;
  private attempt = 0;
  private timer: NodeJS.Timeout | null = null;
  private listening: Promise<void>;
  private markListening!: () => void;

  constructor(private readonly databaseUrl: string) {
    this.listening = new Promise((resolve) => (this.markListening = resolve));
  }

  /** Calls `fn` for every run event of the session (and on resync); answers the unsubscribe. */
  subscribe(sessionId: string, fn: Listener): () => void {
    let set = this.bySession.get(sessionId);
    if (!set) this.bySession.set(sessionId, (set = new Set()));
    set.add(fn);
    if (!this.started) {
      this.started = true;
      void this.connect();
    }
    return () => {
      set.delete(fn);
      if (!set.size) this.bySession.delete(sessionId);
    };
  }

  /** Resolves once LISTEN is active (or after `timeoutMs`, false). */
  async ready(timeoutMs = 5000): Promise<boolean> {
    let t: NodeJS.Timeout | undefined;
    const timeout = new Promise<boolean>((resolve) => (t = setTimeout(() => resolve(false), timeoutMs)));
    const ok = await Promise.race([this.listening.then(() => true), timeout]);
    clearTimeout(t);
    return ok;
  }

  /** Subscribers now (for tests and the health of the stream). */
  get subscribers(): number {
    let n = 0;
    for (const s of this.bySession.values()) n += s.size;
    return n;
  }

  async close(): Promise<void> {
    this.closed = true;
    if (this.timer) clearTimeout(this.timer);
    this.bySession.clear();
    const c = this.client;
    this.client = null;
    await c?.end().catch(() => undefined);
  }

  private dispatch(e: LiveEvent, sessionId?: string) {
    const sets = sessionId ? [this.bySession.get(sessionId)] : [...this.bySession.values()];
    for (const set of sets) for (const fn of set ?? []) {
      try {
        fn(e);
      } catch (err) {
        logger.warn({ err }, 'live feed: a subscriber failed');
      }
    }
  }

  private async connect(): Promise<void> {
    if (this.closed) return;
    const client = new pg.Client({ connectionString: this.databaseUrl, keepAlive: true });
    // Without an 'error' listener a lost connection would end the process.
    client.on('error', (err) => logger.warn({ err }, 'live feed: the listening connection failed'));
    client.on('end', () => {
      if (this.client === client) this.client = null;
      this.listening = new Promise((resolve) => (this.markListening = resolve));
      this.retry();
    });
    client.on('notification', (msg) => {
      if (msg.channel !== RUN_CHANNEL) return;
      const notice = parseRunNotice(msg.payload);
      if (notice) this.dispatch({ kind: 'run', notice }, notice.sessionId);
    });
    try {
      await client.connect();
      await client.query(`listen ${RUN_CHANNEL}`);
    } catch (err) {
      logger.warn({ err, attempt: this.attempt }, 'live feed: could not listen; trying again');
      client.removeAllListeners('end');
      client.on('error', () => undefined);
      await client.end().catch(() => undefined);
      this.retry();
      return;
    }
    if (this.closed) {
      await client.end().catch(() => undefined);
      return;
    }
    this.client = client;
    const reconnected = this.attempt > 0;
    this.attempt = 0;
    this.markListening();
    if (reconnected) this.dispatch({ kind: 'resync' });
  }

  private retry() {
    if (this.closed || this.timer) return;
    const delay = Math.min(30_000, 500 * 2 ** this.attempt++);
    this.timer = setTimeout(() => {
      this.timer = null;
      void this.connect();
    }, delay);
    this.timer.unref();
  }
}

/** One feed per app (per deps object), so two app instances in one process each have their own connection. */
const feeds = new WeakMap<object, LiveFeed>();

export function liveFeedFor(owner: object, databaseUrl: string): LiveFeed {
  let feed = feeds.get(owner);
  if (!feed) feeds.set(owner, (feed = new LiveFeed(databaseUrl)));
  return feed;
}

export async function closeLiveFeed(owner: object): Promise<void> {
  const feed = feeds.get(owner);
  feeds.delete(owner);
  await feed?.close();
}
