import { describe, expect, it } from 'vitest';
import { differenceFromBaseline, differenceRange } from '@shared/curve-difference';

// Invented curves on one rpm grid; differences hand-computed.
describe('difference from the baseline', () => {
  const base = { runId: 'base', rpm: [3000, 3500, 4000, 4500], powerHp: [50, 60, 70, 75], torqueLbft: [88, 90, 92, 88] };
  const after = { runId: 'after', rpm: [3500, 4000, 4500, 5000], powerHp: [63, 74, 74, 80], torqueLbft: [95, 97, 87, 85] };
  it('subtracts the baseline where both have a point', () => {
    expect(differenceFromBaseline([base, after], 'base')).toEqual([{ runId: 'after', rpm: [3500, 4000, 4500], powerHp: [3, 4, -1], torqueLbft: [5, 5, -1] }]);
  });
  it('gives nothing without the baseline curve or a shared range', () => {
    expect(differenceFromBaseline([after], 'base')).toEqual([]);
    expect(differenceFromBaseline([base, { ...after, rpm: [9000, 9500] }], 'base')).toEqual([]);
  });
  it('ranges over power and torque in display units, zero included', () => {
    const d = differenceFromBaseline([base, after], 'base');
    expect(differenceRange(d, (v) => v, (v) => v)).toEqual({ min: -1, max: 5 });
    // 1 hp = 745.6999 W (NIST SP 811): 4 hp = 2.983 kW.
    expect(differenceRange(d, (v) => (v * 745.6999) / 1000, () => 0).max).toBeCloseTo(2.983, 3);
  });
});
