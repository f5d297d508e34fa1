import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import fc from 'fast-check';
import { CC_PER_CUBIC_INCH, ccToCubicInches, cubicInchesToCc, toCc } from '@shared/displacement';
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
