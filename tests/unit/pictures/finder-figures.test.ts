import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { quantileSeq } from 'mathjs';
import type { BuildItemDto } from '@shared/schemas/builds';
import { costGainPoints, gainsByCategory, quantileSorted } from '@/features/finder/components/finder-figures';

// Reference: mathjs quantileSeq (linear interpolation between closest ranks, Hyndman & Fan type 7),
// and hand-worked values: for [1, 2, 3, 4] the type-7 quartiles are 1.75, 2.5, 3.25
// (h = 3 × 0.25 = 0.75 → 1 + 0.75 × (2 − 1)).
describe('quantiles (type 7)', () => {
  it('matches hand-worked quartiles', () => {
    expect(quantileSorted([1, 2, 3, 4], 0.25)).toBeCloseTo(1.75, 12);
    expect(quantileSorted([1, 2, 3, 4], 0.5)).toBeCloseTo(2.5, 12);
    expect(quantileSorted([1, 2, 3, 4], 0.75)).toBeCloseTo(3.25, 12);
    expect(quantileSorted([7], 0.25)).toBe(7);
  });
  it('agrees with mathjs quantileSeq on random samples', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: -50, max: 50, noNaN: true }), { minLength: 1, maxLength: 40 }), fc.constantFrom(0, 0.25, 0.5, 0.75, 1), (values, p) => {
        const sorted = [...values].sort((a, b) => a - b);
        expect(quantileSorted(sorted, p)).toBeCloseTo(quantileSeq(values, p) as number, 9);
      }),
    );
  });
});

const build = (stageId: string, gain: number | null, costCents: number, categories: BuildItemDto['parts'][number]['category'][]): BuildItemDto =>
  ({ stageId, bikeId: 'b', make: 'Halvorsen', model: 'Brisca', year: 2021, stageName: 'Stage', peakPowerGainHp: gain, cumulativeCostCents: costCents, parts: categories.map((category) => ({ category, description: '', costCents: 0 })) }) as unknown as BuildItemDto;

describe('finder pictures from the builds shown', () => {
  const items = [build('a', 4, 120_000, ['exhaust']), build('b', 10, 300_000, ['exhaust', 'camshaft', 'exhaust']), build('c', null, 50_000, ['exhaust']), build('d', 6, 200_000, ['exhaust', 'camshaft'])];
  it('plots builds with a gain, cost in whole dollars', () => {
    expect(costGainPoints(items).map((p) => [p.stageId, p.cost, p.gainHp])).toEqual([
      ['a', 1200, 4],
      ['b', 3000, 10],
      ['d', 2000, 6],
    ]);
  });
  it('spreads gains per part category, a build counted once per category it has', () => {
    const spreads = gainsByCategory(items);
    // Exhaust: [4, 6, 10] → median 6, q1 = 4 + 0.5 × 2 = 5, q3 = 6 + 0.5 × 4 = 8. Camshaft: [6, 10].
    expect(spreads.map((s) => [s.category, s.count, s.min, s.q1, s.median, s.q3, s.max])).toEqual([
      ['exhaust', 3, 4, 5, 6, 8, 10],
      ['camshaft', 2, 6, 7, 8, 9, 10],
    ]);
  });
});
