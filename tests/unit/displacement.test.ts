import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import fc from 'fast-check';
import { CC_PER_CUBIC_INCH, ccToCubicInches, cubicInchesToCc, guessDisplacementUnit, toCc } from '@shared/displacement';
import { formatCubicInches } from '@shared/units-display';
import { bikeInput } from '@shared/schemas/bike';

describe('displacement units', () => {
  it('uses 1 in³ = 16.387064 cm³ exactly (NIST SP 811, B.9: 1 in = 2.54 cm exactly)', () => {
    expect(CC_PER_CUBIC_INCH).toBeCloseTo(2.54 ** 3, 12);
  });

  it('agrees with mathjs units as an independent reference', () => {
    for (const ci of [45, 88, 96, 103, 107, 114, 117, 124, 131]) {
      expect(cubicInchesToCc(ci)).toBeCloseTo(unit(ci, 'in^3').toNumber('cm^3'), 9);
    }
  });

  it('round-trips cc → in³ → cc', () => {
    fc.assert(fc.property(fc.double({ min: 1, max: 10_000, noNaN: true }), (cc) => Math.abs(cubicInchesToCc(ccToCubicInches(cc)) - cc) < 1e-9 * cc));
  });

  it('stores a bike entered in cubic inches as cm³', () => {
    const parsed = bikeInput.parse({ customerId: '7d444840-9dc0-41d1-9c2d-5f5d1fdb8a61', make: 'M', model: 'N', displacement: 96, displacementUnit: 'ci' });
    expect(parsed.displacementCc).toBeCloseTo(toCc(96, 'ci'), 2);
    expect(parsed.displacementCc).toBeCloseTo(1573.16, 2); // 96 × 16.387064 = 1573.158…
  });

  it('flags an implausible cubic-inch figure instead of storing it', () => {
    const r = bikeInput.safeParse({ customerId: '7d444840-9dc0-41d1-9c2d-5f5d1fdb8a61', make: 'M', model: 'N', displacement: 1690, displacementUnit: 'ci' });
    expect(r.success).toBe(false);
  });
});

describe('guessing the displacement unit from the size', () => {
  it('reads a size above 300 typed as cubic inches as cm³', () => {
    expect(guessDisplacementUnit(1746, 'ci')).toBe('cc');
    expect(guessDisplacementUnit(301, 'ci')).toBe('cc');
    // 1746 cm³ ÷ 16.387064 cm³/in³ (exact, NIST SP 811) = 106.5 in³, cross-checked with mathjs.
    expect(ccToCubicInches(1746)).toBeCloseTo(unit(1746, 'cm^3').toNumber('in^3'), 9);
    expect(formatCubicInches(1746)).toBe('106.5 in³');
  });

  it('keeps cubic inches for sizes that are plausible in³ and never turns cm³ into in³', () => {
    expect(guessDisplacementUnit(107, 'ci')).toBe('ci');
    expect(guessDisplacementUnit(300, 'ci')).toBe('ci');
    expect(guessDisplacementUnit(50, 'cc')).toBe('cc');
    expect(guessDisplacementUnit(1746, 'cc')).toBe('cc');
    expect(guessDisplacementUnit(Number.NaN, 'ci')).toBe('ci');
  });
});
