/**
 * The shop's own calendar day. "Today's session" on a dyno and the dates printed on reports and
 * quotes follow the shop's IANA time zone (e.g. "America/Denver"), not the server's clock, which
 * runs on UTC in a hosted deployment. Built on the platform's Intl (ECMA-402) and its copy of the
 * IANA time-zone database, so daylight-saving rules come from there, not from code of our own.
 */

/** Every zone name this runtime knows, for the settings list. */
export function timeZoneNames(): string[] {
  const names = typeof Intl.supportedValuesOf === 'function' ? Intl.supportedValuesOf('timeZone') : [];
  return names.includes('UTC') ? names : ['UTC', ...names];
}

/** True for a zone name Intl accepts ("Europe/Oslo", "UTC"); false for anything else. */
export function isTimeZone(name: string): boolean {
  if (!name || name.length > 64) return false;
  try {
    new Intl.DateTimeFormat('en-US', { timeZone: name });
    return true;
  } catch {
    return false;
  }
}

const partsFormat = new Map<string, Intl.DateTimeFormat>();

/** The wall-clock fields of `at` in `zone`. */
function wallClock(zone: string, at: number): { y: number; m: number; d: number; h: number; min: number; s: number } {
  let f = partsFormat.get(zone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', { timeZone: zone, hourCycle: 'h23', year: 'numeric', month: 'numeric', day: 'numeric', hour: 'numeric', minute: 'numeric', second: 'numeric' });
    partsFormat.set(zone, f);
  }
  const p = Object.fromEntries(f.formatToParts(at).map((x) => [x.type, Number(x.value)]));
  return { y: p.year, m: p.month, d: p.day, h: p.hour, min: p.minute, s: p.second };
}

/** How far `zone`'s wall clock is ahead of UTC at the instant `at`, in milliseconds. */
export function zoneOffsetMs(zone: string, at: number): number {
  const w = wallClock(zone, at);
  return Date.UTC(w.y, w.m - 1, w.d, w.h, w.min, w.s) - Math.floor(at / 1000) * 1000;
}

/**
 * The instant the calendar day holding `now` began in `zone`. Where a daylight-saving change
 * skips midnight, the day begins at the first wall-clock time that exists.
 */
export function startOfDayIn(zone: string, now: Date = new Date()): Date {
  const w = wallClock(zone, now.getTime());
  const midnightAsUtc = Date.UTC(w.y, w.m - 1, w.d);
  // Two passes: the offset at local midnight can differ from the offset now (a change that day).
  let guess = midnightAsUtc - zoneOffsetMs(zone, now.getTime());
  guess = midnightAsUtc - zoneOffsetMs(zone, guess);
  const back = wallClock(zone, guess);
  if (back.d !== w.d) {
    // Midnight did not exist (clocks jumped forward over it): the day began when the jump ended.
    guess = midnightAsUtc - zoneOffsetMs(zone, guess + 3_600_000);
  }
  return new Date(guess);
}
