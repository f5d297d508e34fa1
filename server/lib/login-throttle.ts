/**
 * Sign-in throttling instead of lockout (OWASP ASVS 4.0 §2.2.1: anti-automation that keeps an
 * account to at most 100 failed attempts an hour, without letting an attacker lock the real user
 * out). Three counters of failed attempts, kept in PostgreSQL so every app instance shares them:
 *
 * - per account and client address: a few free tries, then a doubling wait;
 * - per account, over all addresses: more free tries, then a doubling wait with a short cap — but
 *   it does not apply from an address that signed in to this account successfully before
 *   ("known"), so the user's own sign-in works while someone hammers from elsewhere;
 * - per client address, over all accounts (credential stuffing): failures only, so a shop's
 *   people signing in behind one NAT never use it up.
 *
 * An attempt is counted as failed before the password is checked (so parallel guesses cannot
 * slip past), and the count is taken back when the password was right.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import { AppError } from './errors';

export interface ThrottleRule {
  /** Failures allowed before any wait. */
  free: number;
  /** The wait after the first failure beyond `free`, in seconds; each later one doubles. */
  baseSeconds: number;
  /** The longest wait, in seconds. */
  capSeconds: number;
  /** Failures older than this are forgotten, in seconds. */
  windowSeconds: number;
}

/**
 * Our numbers (common practice, no published source), checked against ASVS §2.2.1's ceiling of
 * 100 failures an hour per account in tests/unit/login-throttle.test.ts.
 */
export const LOGIN_THROTTLE = {
  pair: { free: 5, baseSeconds: 30, capSeconds: 15 * 60, windowSeconds: 3600 },
  account: { free: 10, baseSeconds: 1, capSeconds: 60, windowSeconds: 3600 },
  ip: { free: 50, baseSeconds: 30, capSeconds: 15 * 60, windowSeconds: 3600 },
} as const satisfies Record<string, ThrottleRule>;

/** How long a successful sign-in keeps an address "known" for that account. */
export const KNOWN_PAIR_SECONDS = 30 * 24 * 3600;

/** The wait a counter imposes after `failures` failures (0 while within the free tries). */
export function delayAfter(failures: number, rule: ThrottleRule): number {
  if (failures < rule.free) return 0;
  return Math.min(rule.capSeconds, rule.baseSeconds * 2 ** Math.min(30, failures - rule.free));
}

/** Seconds still to wait, given the failures in the window and the seconds since the last one. */
export function waitLeft(failures: number, secondsSinceLast: number, rule: ThrottleRule): number {
  return Math.max(0, delayAfter(failures, rule) - secondsSinceLast);
}

/**
 * The most failures an attacker can make on one account in `seconds` from addresses that never
 * signed in to it, trying again the moment each wait ends (for the ASVS check).
 */
export function maxFailuresIn(seconds: number, rule: ThrottleRule): number {
  let t = 0;
  let n = 0;
  for (;;) {
    const wait = delayAfter(n, rule);
    if (t + wait > seconds) return n;
    t += wait;
    n += 1;
  }
}

type Keys = { pair: string; account: string; ip: string; known: string };
const keysOf = (email: string, ip: string): Keys => {
  const e = email.trim().toLowerCase();
  return { pair: `pair:${e}|${ip}`, account: `account:${e}`, ip: `ip:${ip}`, known: `known:${e}|${ip}` };
};

interface Row {
  key: string;
  failures: number;
  since_last: string;
  age: string;
}

const MESSAGE = 'Too many sign-in attempts; wait a little and try again';

/**
 * Refuses the attempt with 429 (and the seconds to wait) while a counter asks for a wait, and
 * otherwise counts it as failed until `signInSucceeded` takes it back.
 */
export async function beginSignInAttempt(em: EntityManager, email: string, ip: string): Promise<void> {
  const k = keysOf(email, ip);
  const conn = em.getConnection();
  const rows = (await conn.execute(
    `select key, failures, extract(epoch from now() - last_at) as since_last, extract(epoch from now() - window_start) as age
     from login_throttle where key in (?, ?, ?, ?)`,
    [k.pair, k.account, k.ip, k.known],
  )) as Row[];
  const byKey = new Map(rows.map((r) => [r.key, r]));
  const wait = (key: string, rule: ThrottleRule) => {
    const r = byKey.get(key);
    if (!r || Number(r.age) > rule.windowSeconds) return 0;
    return waitLeft(r.failures, Number(r.since_last), rule);
  };
  const known = byKey.get(k.known);
  const isKnown = known !== undefined && Number(known.since_last) < KNOWN_PAIR_SECONDS;
  const seconds = Math.max(wait(k.pair, LOGIN_THROTTLE.pair), wait(k.ip, LOGIN_THROTTLE.ip), isKnown ? 0 : wait(k.account, LOGIN_THROTTLE.account));
  if (seconds > 0) throw new AppError('RATE_LIMITED', MESSAGE, 429, { retryAfterSeconds: Math.max(1, Math.ceil(seconds)) });
  for (const [key, rule] of [[k.pair, LOGIN_THROTTLE.pair], [k.account, LOGIN_THROTTLE.account], [k.ip, LOGIN_THROTTLE.ip]] as const) {
    await conn.execute(
      `insert into login_throttle (key, failures, window_start, last_at) values (?, 1, now(), now())
       on conflict (key) do update set
         failures = case when login_throttle.window_start < now() - make_interval(secs => ?) then 1 else login_throttle.failures + 1 end,
         window_start = case when login_throttle.window_start < now() - make_interval(secs => ?) then now() else login_throttle.window_start end,
         last_at = now()`,
      [key, rule.windowSeconds, rule.windowSeconds],
    );
  }
}

/** The password was right: the attempt is not a failure, and the address is known for the account. */
export async function signInSucceeded(em: EntityManager, email: string, ip: string): Promise<void> {
  const k = keysOf(email, ip);
  const conn = em.getConnection();
  await conn.execute('delete from login_throttle where key = ?', [k.pair]);
  await conn.execute('update login_throttle set failures = greatest(failures - 1, 0) where key in (?, ?)', [k.account, k.ip]);
  await conn.execute(
    `insert into login_throttle (key, failures, window_start, last_at) values (?, 0, now(), now()) on conflict (key) do update set last_at = now()`,
    [k.known],
  );
}
