/**
 * The shop's calendar day. Expected instants come from the IANA time-zone database (tzdata) rules:
 * - United States: daylight time from the second Sunday of March, 02:00 local, to the first Sunday
 *   of November (Energy Policy Act of 2005, §110); Denver is UTC−7 standard, UTC−6 daylight.
 * - European Union: summer time from 01:00 UTC on the last Sunday of March to 01:00 UTC on the last
 *   Sunday of October (Directive 2000/84/EC); London is UTC+0 / UTC+1.
 * - India: UTC+5:30 all year, no daylight time. Chatham Islands: UTC+12:45 standard, +13:45 daylight.
 * - America/Santiago: Chile moves its clocks at 24:00, so on the day summer time starts the local
 *   day begins at 01:00 (tzdata "Chile" rules: first Sunday of September).
 * The rules are quoted from memory; the runtime's own copy of tzdata agrees with every value here.
 */
import { describe, expect, it } from 'vitest';
import { isTimeZone, startOfDayIn, timeZoneNames, zoneOffsetMs } from '@shared/time-zone';

const at = (iso: string) => new Date(iso);

describe('startOfDayIn', () => {
  it('is UTC midnight in UTC', () => {
    expect(startOfDayIn('UTC', at('2026-12-02T22:30:00Z')).toISOString()).toBe('2026-12-02T00:00:00.000Z');
  });

  it('keeps an evening in Denver on the local day, not the next UTC day', () => {
    // 2026-12-02 22:30 UTC is 15:30 in Denver (UTC−7 in winter): the day began at 07:00 UTC.
    expect(startOfDayIn('America/Denver', at('2026-12-02T22:30:00Z')).toISOString()).toBe('2026-12-02T07:00:00.000Z');
    // 2026-12-03 03:00 UTC is still 20:00 on Dec 2 in Denver.
    expect(startOfDayIn('America/Denver', at('2026-12-03T03:00:00Z')).toISOString()).toBe('2026-12-02T07:00:00.000Z');
  });

  it('uses the offset in force at local midnight on the days the US clocks change', () => {
    // 2026-03-08 (second Sunday of March): midnight is still standard time, UTC−7.
    expect(startOfDayIn('America/Denver', at('2026-03-08T20:00:00Z')).toISOString()).toBe('2026-03-08T07:00:00.000Z');
    // 2026-11-01 (first Sunday of November): midnight is still daylight time, UTC−6.
    expect(startOfDayIn('America/Denver', at('2026-11-01T20:00:00Z')).toISOString()).toBe('2026-11-01T06:00:00.000Z');
  });

  it('follows the EU rule in London', () => {
    // 2026-03-29 is the last Sunday of March: midnight is GMT, summer time starts at 01:00 UTC.
    expect(startOfDayIn('Europe/London', at('2026-03-29T12:00:00Z')).toISOString()).toBe('2026-03-29T00:00:00.000Z');
    // The next day midnight is BST (UTC+1): 23:00 UTC the evening before.
    expect(startOfDayIn('Europe/London', at('2026-03-30T12:00:00Z')).toISOString()).toBe('2026-03-29T23:00:00.000Z');
  });

  it('handles offsets that are not whole hours', () => {
    // Kolkata UTC+5:30: local midnight of Dec 3 is 18:30 UTC on Dec 2.
    expect(startOfDayIn('Asia/Kolkata', at('2026-12-02T22:30:00Z')).toISOString()).toBe('2026-12-02T18:30:00.000Z');
    // Chatham UTC+13:45 in (southern) summer: midnight of Dec 3 is 10:15 UTC on Dec 2.
    expect(startOfDayIn('Pacific/Chatham', at('2026-12-02T22:30:00Z')).toISOString()).toBe('2026-12-02T10:15:00.000Z');
  });

  it('starts the day at the first existing time when midnight is skipped', () => {
    // Chile, 2026-09-06: clocks go from 24:00 (UTC−4) to 01:00 (UTC−3); 01:00 local is 04:00 UTC.
    expect(startOfDayIn('America/Santiago', at('2026-09-06T15:00:00Z')).toISOString()).toBe('2026-09-06T04:00:00.000Z');
  });

  it('gives each instant of a day the same start, every three hours across a year', () => {
    for (const zone of ['America/Denver', 'Europe/London', 'Australia/Lord_Howe', 'America/Santiago']) {
      for (let t = Date.UTC(2026, 0, 1); t < Date.UTC(2027, 0, 1); t += 3 * 3_600_000 + 60_000) {
        const start = startOfDayIn(zone, new Date(t)).getTime();
        expect(start).toBeLessThanOrEqual(t);
        expect(t - start).toBeLessThan(25 * 3_600_000);
        // The start is on the same local date as t, and a second earlier is the previous date.
        const day = (x: number) => new Date(x + zoneOffsetMs(zone, x)).toISOString().slice(0, 10);
        expect(day(start)).toBe(day(t));
        expect(day(start - 1000)).not.toBe(day(t));
      }
    }
  });
});

describe('isTimeZone', () => {
  it('accepts IANA names and refuses anything else', () => {
    expect(isTimeZone('America/Denver')).toBe(true);
    expect(isTimeZone('UTC')).toBe(true);
    expect(isTimeZone('Mars/Olympus_Mons')).toBe(false);
    expect(isTimeZone('')).toBe(false);
    expect(isTimeZone('x'.repeat(100))).toBe(false);
  });

  it('lists UTC and the common zones for the settings page', () => {
    const names = timeZoneNames();
    expect(names).toContain('UTC');
    expect(names).toContain('America/Denver');
    expect(names).toContain('Europe/London');
  });
});
