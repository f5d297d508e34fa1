import { describe, expect, it } from 'vitest';
import { delayAfter, LOGIN_THROTTLE, maxFailuresIn, waitLeft } from '@server/lib/login-throttle';

describe('login throttle rules', () => {
  it('keeps any account under 100 failed attempts an hour (OWASP ASVS 4.0 §2.2.1)', () => {
    expect(maxFailuresIn(3600, LOGIN_THROTTLE.account)).toBeLessThanOrEqual(100);
    // And from one address per account far fewer: 5 free, then 30 s, 60 s, 120 s … (capped at 15 min).
    expect(maxFailuresIn(3600, LOGIN_THROTTLE.pair)).toBeLessThanOrEqual(15);
  });

  it('gives free tries, then doubles the wait up to its cap', () => {
    const rule = { free: 3, baseSeconds: 2, capSeconds: 10, windowSeconds: 60 };
    expect([0, 1, 2, 3, 4, 5, 6].map((n) => delayAfter(n, rule))).toEqual([0, 0, 0, 2, 4, 8, 10]);
  });

  it('counts the wait from the last failure', () => {
    const rule = { free: 1, baseSeconds: 30, capSeconds: 900, windowSeconds: 3600 };
    expect(waitLeft(1, 10, rule)).toBe(20);
    expect(waitLeft(1, 45, rule)).toBe(0);
    expect(waitLeft(0, 0, rule)).toBe(0);
  });

  it('counts failures an attacker can fit in a time span by stepping through the waits', () => {
    // free 2, then 1 s, 2 s, 4 s: failures at t = 0, 0, 1, 3, 7 → five by t = 7, still five at t = 14.
    const rule = { free: 2, baseSeconds: 1, capSeconds: 100, windowSeconds: 3600 };
    expect(maxFailuresIn(7, rule)).toBe(5);
    expect(maxFailuresIn(14, rule)).toBe(5);
    expect(maxFailuresIn(15, rule)).toBe(6);
  });
});
