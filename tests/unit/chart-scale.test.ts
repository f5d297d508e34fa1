import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  HP_LBFT_CROSS_RPM,
  KW_NM_CROSS_RPM,
  niceStep,
  powerTorqueCrossRpm,
  sharedPowerTorqueRange,
} from '@shared/chart-scale';

// Sources:
//  - NIST SP 811 (2008): 1 hp = 550 ft·lbf/s, so hp = lb·ft × rpm / (33 000 / 2π) = lb·ft × rpm / 5252.113;
//    kW = N·m × rpm / (60 000 / 2π) = N·m × rpm / 9549.297 (1 W = 1 N·m/s).
//  - Nice-step bounds (1, 2, 2.5, 5 × 10^k) are our own rule; the expected values are hand-computed
//    in the comment beside each case.

describe('crossing constants (NIST SP 811 definition of the horsepower)', () => {
  it('hp and lb·ft cross at 33 000 / 2π ≈ 5252.113 rpm', () => {
    expect(HP_LBFT_CROSS_RPM).toBeCloseTo(5252.113, 3);
    expect(powerTorqueCrossRpm('hp', 'lbft')).toBe(HP_LBFT_CROSS_RPM);
  });
  it('kW and N·m cross at 60 000 / 2π ≈ 9549.297 rpm', () => {
    expect(KW_NM_CROSS_RPM).toBeCloseTo(9549.297, 3);
    expect(powerTorqueCrossRpm('kw', 'nm')).toBe(KW_NM_CROSS_RPM);
  });
  it('mixed unit pairs have no promised crossing', () => {
    expect(powerTorqueCrossRpm('hp', 'nm')).toBeNull();
    expect(powerTorqueCrossRpm('ps', 'nm')).toBeNull();
    expect(powerTorqueCrossRpm('kw', 'lbft')).toBeNull();
  });
});

describe('niceStep (hand-computed)', () => {
  it('picks 1, 2, 2.5, 5 × 10^k', () => {
    expect(niceStep(100)).toBe(20); // 100/5 = 20 → 2 × 10
    expect(niceStep(125)).toBe(25); // 25 → 2.5 × 10
    expect(niceStep(130)).toBe(50); // 26 → next nice is 5 × 10
    expect(niceStep(5)).toBe(1); // 1 → 1 × 1
    expect(niceStep(0)).toBe(1);
  });
});

describe('sharedPowerTorqueRange (hand-computed)', () => {
  it('one range covering both curves, from 0, rounded up to a nice step', () => {
    // 118 hp, 124 lb·ft → span 124, step 124/5 = 24.8 → 25; ceil(124/25) × 25 = 125.
    expect(sharedPowerTorqueRange(118, 124)).toEqual({ min: 0, max: 125 });
    // 92.4 kW, 131 N·m → span 131, step 26.2 → 50; ceil(131/50) × 50 = 150.
    expect(sharedPowerTorqueRange(92.4, 131)).toEqual({ min: 0, max: 150 });
  });
  it('goes below zero only when a curve does', () => {
    // span 100 − (−12) = 112, step 22.4 → 25; floor(−12/25) × 25 = −25; ceil(100/25) × 25 = 100.
    expect(sharedPowerTorqueRange(100, 80, -12, 5)).toEqual({ min: -25, max: 100 });
    expect(sharedPowerTorqueRange(100, 80, 20, 30).min).toBe(0);
  });
  it('degenerate input gives 0–1', () => {
    expect(sharedPowerTorqueRange(0, 0)).toEqual({ min: 0, max: 1 });
    expect(sharedPowerTorqueRange(Number.NaN, Number.NaN)).toEqual({ min: 0, max: 1 });
  });
  it('always contains both maxima and minima (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 2000, noNaN: true }),
        fc.double({ min: 0, max: 2000, noNaN: true }),
        fc.integer({ min: -2000, max: 0 }).map((n) => n / 10),
        (p, t, lo) => {
          if (Math.max(p, t) - lo < 0.01) return true; // sub-pixel spans: covered by the degenerate case
          const r = sharedPowerTorqueRange(p, t, lo, 0);
          return r.min <= lo && r.max >= Math.max(p, t) && r.max > r.min;
        },
      ),
    );
  });
  it('on a shared scale a curve pair with hp = lb·ft × rpm / 5252.113 meets at 5,252 rpm', () => {
    // Flat 100 lb·ft torque: hp(5252.113) = 100 × 5252.113 / 5252.113 = 100 = torque — same value,
    // and on one scale the same pixel height.
    const torque = 100;
    const hp = (torque * HP_LBFT_CROSS_RPM) / (33_000 / (2 * Math.PI));
    const r = sharedPowerTorqueRange(hp, torque);
    const y = (v: number) => (v - r.min) / (r.max - r.min);
    expect(y(hp)).toBeCloseTo(y(torque), 12);
  });
});
