import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  MINUS,
  MISSING,
  formatCostPerHp,
  formatCount,
  formatDate,
  formatDateTime,
  formatFileSize,
  formatGain,
  formatHp,
  formatMoney,
  formatNumber,
  formatPercent,
  formatPercentChange,
  formatPower,
  formatRpm,
  formatRpmRange,
  formatTorque,
  toDate,
} from '@shared/format';

// Expected strings come from three places, named per case:
//  - the product's voice examples in PRODUCT.md ("+6.1 hp at peak", "above 4,800 rpm");
//  - ECMA-402 Intl.NumberFormat rounding, mode "halfExpand" (ties round away from zero);
//  - ISO 4217 minor units (USD has 2, JPY has 0).
// Other values are worked by hand in the comment beside them.

describe('formatNumber', () => {
  it('groups thousands with commas in en-US', () => {
    expect(formatNumber(4800)).toBe('4,800');
    expect(formatNumber(1234567.891, { decimals: 2 })).toBe('1,234,567.89');
  });

  it('can leave grouping off', () => {
    expect(formatNumber(4800, { grouping: false })).toBe('4800');
  });

  it('rounds ties away from zero (ECMA-402 halfExpand)', () => {
    expect(formatNumber(2.5)).toBe('3');
    expect(formatNumber(-2.5)).toBe(`${MINUS}3`);
    expect(formatNumber(0.125, { decimals: 2 })).toBe('0.13');
  });

  it('writes negatives with the minus sign U+2212, not a hyphen', () => {
    const text = formatNumber(-12.34, { decimals: 1 });
    expect(text).toBe('\u221212.3');
    expect(text).not.toContain('-');
  });

  it.each([null, undefined, Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY])(
    'shows the missing marker for %s',
    (value) => {
      expect(formatNumber(value)).toBe(MISSING);
      expect(formatHp(value)).toBe(MISSING);
      expect(formatRpm(value)).toBe(MISSING);
      expect(formatGain(value)).toBe(MISSING);
      expect(formatMoney(value)).toBe(MISSING);
    },
  );

  it('parses back to within half a unit in the last place for any finite value', () => {
    fc.assert(
      fc.property(fc.double({ min: -1e9, max: 1e9, noNaN: true }), fc.integer({ min: 0, max: 3 }), (value, decimals) => {
        const text = formatNumber(value, { decimals });
        const parsed = Number(text.replaceAll(',', '').replace(MINUS, '-'));
        // Half a unit in the last place, plus a little room for binary representation.
        expect(Math.abs(parsed - value)).toBeLessThanOrEqual(0.5 * 10 ** -decimals + 1e-6);
        const fraction = text.split('.')[1] ?? '';
        expect(fraction.length).toBe(decimals);
      }),
    );
  });
});

describe('power, torque and rpm', () => {
  it('shows horsepower with one decimal', () => {
    expect(formatHp(112.44)).toBe('112.4 hp');
    expect(formatHp(112.45)).toBe('112.5 hp'); // halfExpand
    expect(formatHp(98)).toBe('98.0 hp');
  });

  it('shows other power and torque units', () => {
    expect(formatPower(83.9, 'kW')).toBe('83.9 kW');
    expect(formatPower(114, 'PS', 0)).toBe('114 PS');
    expect(formatTorque(98.24)).toBe('98.2 lb·ft');
    expect(formatTorque(133.2, 'N·m')).toBe('133.2 N·m');
  });

  it('shows rpm as whole numbers with thousands separators (PRODUCT.md: "above 4,800 rpm")', () => {
    expect(formatRpm(4800)).toBe('4,800 rpm');
    expect(formatRpm(4799.6)).toBe('4,800 rpm');
    expect(formatRpm(950)).toBe('950 rpm');
    expect(formatRpmRange(3000, 5500)).toBe('3,000–5,500 rpm');
    expect(formatRpmRange(3000, null)).toBe(MISSING);
  });
});

describe('formatGain', () => {
  it('signs a gain (PRODUCT.md: "+6.1 hp at peak")', () => {
    expect(formatGain(6.1)).toBe('+6.1 hp');
    expect(formatGain(6.06)).toBe('+6.1 hp');
  });

  it('signs a loss with the minus sign', () => {
    expect(formatGain(-2)).toBe(`${MINUS}2.0 hp`);
    expect(formatGain(-3.4, 'lb·ft')).toBe(`${MINUS}3.4 lb·ft`);
  });

  it('never shows a signed zero', () => {
    expect(formatGain(0)).toBe('0.0 hp');
    expect(formatGain(-0.04)).toBe('0.0 hp'); // rounds to zero at one decimal
    expect(formatGain(0.04)).toBe('0.0 hp');
    expect(formatGain(-0)).toBe('0.0 hp');
  });

  it('puts "+" on every value that rounds above zero and the minus sign on every value that rounds below', () => {
    fc.assert(
      fc.property(fc.double({ min: -1000, max: 1000, noNaN: true }), (delta) => {
        const text = formatGain(delta);
        const rounded = Math.round(Math.abs(delta) * 10) / 10;
        if (rounded === 0) expect(text).toBe('0.0 hp');
        else if (delta > 0) expect(text.startsWith('+')).toBe(true);
        else expect(text.startsWith(MINUS)).toBe(true);
      }),
    );
  });
});

describe('percentages', () => {
  it('takes a fraction and shows a percentage', () => {
    expect(formatPercent(0.062)).toBe('6.2%');
    expect(formatPercent(1)).toBe('100.0%');
    expect(formatPercent(0.5, 0)).toBe('50%');
  });

  it('rounds the percentage, not the fraction (0.0625 → 6.25% → 6.3% by halfExpand)', () => {
    expect(formatPercent(0.0625)).toBe('6.3%');
  });

  it('signs percentage changes', () => {
    expect(formatPercentChange(0.054)).toBe('+5.4%');
    expect(formatPercentChange(-0.021)).toBe(`${MINUS}2.1%`);
    expect(formatPercentChange(0)).toBe('0.0%');
  });
});

describe('money', () => {
  it('shows US dollars with cents (ISO 4217: USD has 2 minor units)', () => {
    expect(formatMoney(1250)).toBe('$1,250.00');
    expect(formatMoney(125000, { minorUnits: true })).toBe('$1,250.00');
    expect(formatMoney(1250.5, { wholeUnits: true })).toBe('$1,251');
  });

  it('respects a currency without minor units (ISO 4217: JPY has 0)', () => {
    expect(formatMoney(1250, { currency: 'JPY', minorUnits: true })).toBe('¥1,250');
  });

  it('writes a negative amount with the minus sign', () => {
    expect(formatMoney(-40)).toBe(`${MINUS}$40.00`);
  });

  it('shows cost per horsepower of gain, rounded to whole units', () => {
    // 1250 / 6.1 = 204.92 → $205
    expect(formatCostPerHp(1250, 6.1)).toBe('$205 per hp');
    // 180000 cents / 12 hp = 15000 cents = $150
    expect(formatCostPerHp(180000, 12, { minorUnits: true })).toBe('$150 per hp');
  });

  it('has no cost per horsepower without a gain', () => {
    expect(formatCostPerHp(1250, 0)).toBe(MISSING);
    expect(formatCostPerHp(1250, -1.5)).toBe(MISSING);
    expect(formatCostPerHp(null, 5)).toBe(MISSING);
  });
});

describe('dates', () => {
  it('treats a date-only string as that calendar day in every time zone', () => {
    const date = toDate('2025-03-12');
    expect(date?.getFullYear()).toBe(2025);
    expect(date?.getMonth()).toBe(2);
    expect(date?.getDate()).toBe(12);
    expect(formatDate('2025-03-12')).toBe('Mar 12, 2025');
    expect(formatDate('2025-03-12', { timeZone: 'Pacific/Honolulu' })).toBe('Mar 12, 2025');
  });

  it('formats instants in the requested zone', () => {
    expect(formatDate('2025-03-12T23:30:00Z', { timeZone: 'UTC' })).toBe('Mar 12, 2025');
    // 23:30 UTC is 09:30 the next day in Sydney (UTC+11 in March, daylight saving)
    expect(formatDate('2025-03-12T23:30:00Z', { timeZone: 'Australia/Sydney' })).toBe('Mar 13, 2025');
    expect(formatDateTime('2025-03-12T14:05:00Z', { timeZone: 'UTC' })).toMatch(/^Mar 12, 2025,? 2:05\s?PM$/);
  });

  it('accepts Date objects and epoch milliseconds', () => {
    const instant = Date.UTC(2024, 0, 31, 12);
    expect(formatDate(instant, { timeZone: 'UTC' })).toBe('Jan 31, 2024');
    expect(formatDate(new Date(instant), { timeZone: 'UTC' })).toBe('Jan 31, 2024');
  });

  it('shows the missing marker for empty or invalid dates', () => {
    expect(formatDate(null)).toBe(MISSING);
    expect(formatDate('')).toBe(MISSING);
    expect(formatDate('not a date')).toBe(MISSING);
    expect(formatDateTime(new Date(Number.NaN))).toBe(MISSING);
  });
});

describe('file sizes and counts', () => {
  it('uses decimal units', () => {
    expect(formatFileSize(0)).toBe('0 bytes');
    expect(formatFileSize(1)).toBe('1 byte');
    expect(formatFileSize(999)).toBe('999 bytes');
    expect(formatFileSize(1000)).toBe('1.0 kB');
    expect(formatFileSize(1_250_000)).toBe('1.3 MB'); // 1.25 MB, halfExpand
    expect(formatFileSize(999_960)).toBe('1.0 MB'); // would otherwise read "1,000.0 kB"
    expect(formatFileSize(-1)).toBe(MISSING);
  });

  it('agrees the noun with the count', () => {
    expect(formatCount(1, 'run')).toBe('1 run');
    expect(formatCount(0, 'run')).toBe('0 runs');
    expect(formatCount(1200, 'run')).toBe('1,200 runs');
    expect(formatCount(2, 'cross-check', 'cross-checks')).toBe('2 cross-checks');
  });
});
