/**
 * The pure half of the typical outcome and the plan prediction. Quantiles are checked against
 * simple-statistics, whose `quantile` is Hyndman & Fan type 7 (its documentation: linear
 * interpolation, "(n − 1)·p", matching R's default and NumPy's "linear" method).
 */
import { describe, expect, it } from 'vitest';
import { median, quantile } from 'simple-statistics';
import { MIN_CONFIDENT_BUILDS, costPerHpCents, depositFor, gainBand, gainCurve, outcomeMessage, summarizeOutcome, sumOfMedians } from '@server/modules/builds/outcome-engine';
import { planKeys } from '@server/modules/plans/plan-prediction';

const build = (peak: number, avg: number | null, cost: number) => ({ peakPowerGainHp: peak, averagePowerGainHp: avg, costCents: cost });

describe('summarizeOutcome', () => {
  it('gives R-7 five-number summaries equal to simple-statistics', () => {
    const peaks = [9.5, 3.2, 14.1, 7.7, 11, 6.05, 12.4];
    const avgs = [4.1, 1.9, 7.2, null, 5.5, 3.3, 6.6];
    const s = summarizeOutcome(peaks.map((p, i) => build(p, avgs[i], 1000 * (i + 1))));
    expect(s.count).toBe(7);
    expect(s.peakPowerGainHp!.q1).toBeCloseTo(quantile(peaks, 0.25), 12);
    expect(s.peakPowerGainHp!.median).toBeCloseTo(median(peaks), 12);
    expect(s.peakPowerGainHp!.q3).toBeCloseTo(quantile(peaks, 0.75), 12);
    expect(s.peakPowerGainHp!.min).toBe(3.2);
    expect(s.peakPowerGainHp!.max).toBe(14.1);
    const known = avgs.filter((v): v is number => v !== null);
    expect(s.averagePowerGainHp!.q1).toBeCloseTo(quantile(known, 0.25), 12);
    expect(s.averagePowerGainHp!.q3).toBeCloseTo(quantile(known, 0.75), 12);
    expect(s.costCents).toEqual({ min: 1000, median: median([1000, 2000, 3000, 4000, 5000, 6000, 7000]), max: 7000 });
    expect(s.lowConfidence).toBe(false);
  });

  it('flags fewer than 5 builds as low confidence and says so in past-tense words', () => {
    expect(MIN_CONFIDENT_BUILDS).toBe(5);
    const s = summarizeOutcome([build(6, 3, 100), build(8, 4, 100)]);
    expect(s.lowConfidence).toBe(true);
    expect(outcomeMessage(s, 'Camshaft', true)).toMatch(/^Only 2 similar builds had camshaft measured — too few to call typical/);
    expect(outcomeMessage(summarizeOutcome([]), 'Camshaft', true)).toMatch(/No similar build/);
    expect(outcomeMessage(s, 'Camshaft', false)).toMatch(/nothing to compare/);
  });
});

describe('estimate, cost per hp and deposit', () => {
  it('sums single-category medians (simple-statistics medians) and refuses when one part has none', () => {
    const cam = [5, 9, 6, 8];
    const heads = [10, 12, 8];
    const parts = [{ key: 'camshaft', summary: summarizeOutcome(cam.map((p) => build(p, p / 2, 0))) }, { key: 'cylinder-heads:mild-port', summary: summarizeOutcome(heads.map((p) => build(p, p / 2, 0))) }];
    const sum = sumOfMedians(parts)!;
    expect(sum.peakPowerGainHp).toBeCloseTo(median(cam) + median(heads), 12);
    expect(sum.averagePowerGainHp).toBeCloseTo(median(cam.map((p) => p / 2)) + median(heads.map((p) => p / 2)), 12);
    expect(sumOfMedians([...parts, { key: 'exhaust', summary: summarizeOutcome([]) }])).toBeNull();
  });

  it('divides the total by the median gain in whole cents, only for a positive gain', () => {
    expect(costPerHpCents(150_050, 10.5)).toBe(14_290); // 150,050 / 10.5 = 14,290.476… (worked by hand)
    expect(costPerHpCents(100_000, 0)).toBeNull();
    expect(costPerHpCents(100_000, -2)).toBeNull();
    expect(costPerHpCents(100_000, null)).toBeNull();
  });

  it('asks a percentage rounded half up, or a fixed sum, never more than the plan', () => {
    expect(depositFor({ mode: 'percent', percent: 25, fixedCents: 0 }, 150_050)).toBe(37_513); // 37,512.5 → 37,513
    expect(depositFor({ mode: 'percent', percent: 10, fixedCents: 0 }, 99_999)).toBe(10_000); // 9,999.9 → 10,000
    expect(depositFor({ mode: 'fixed', percent: 0, fixedCents: 50_000 }, 30_000)).toBe(30_000);
    expect(depositFor({ mode: 'fixed', percent: 0, fixedCents: 50_000 }, 80_000)).toBe(50_000);
    expect(depositFor({ mode: 'off', percent: 50, fixedCents: 50_000 }, 80_000)).toBe(0);
  });
});

describe('gain band', () => {
  it('takes the R-7 median and quartiles of the gain at each rpm over the builds that cover it', () => {
    const gains = [4, 7, 5.5, 9, 6];
    // Each build gains g × rpm / 6000 between its own rpm limits; the last one stops at 5,000 rpm.
    const curves = gains.map((g, i) => {
      const rpm = [2000, 3000, 4000, 5000, ...(i < 4 ? [6000] : [])];
      return { rpm, gainHp: rpm.map((r) => (g * r) / 6000) };
    });
    const band = gainBand(curves, [2000, 4000, 6000]);
    expect(band.rpm).toEqual([2000, 4000, 6000]);
    expect(band.builds).toEqual([5, 5, 4]);
    const at4000 = gains.map((g) => (g * 4000) / 6000);
    expect(band.median[1]).toBeCloseTo(median(at4000), 12);
    expect(band.q1[1]).toBeCloseTo(quantile(at4000, 0.25), 12);
    expect(band.q3[1]).toBeCloseTo(quantile(at4000, 0.75), 12);
    expect(band.median[2]).toBeCloseTo(median(gains.slice(0, 4)), 12);
    // Fewer than 2 builds at a point: left out.
    expect(gainBand(curves.slice(0, 1), [3000]).rpm).toEqual([]);
  });

  it('measures a build’s gain on the range both runs share', () => {
    const before = { rpm: [2000, 3000, 4000, 5000], powerHp: [40, 60, 80, 90] };
    const after = { rpm: [2500, 3000, 4000, 5000, 5500], powerHp: [55, 66, 88, 99, 100] };
    const g = gainCurve(before, after);
    expect(g.rpm).toEqual([2500, 3000, 4000, 5000]);
    expect(g.gainHp).toEqual([55 - 50, 6, 8, 9]); // 50 = linear between 40 and 60 at 2,500 rpm
  });
});

describe('planKeys', () => {
  it('keys items as the finder indexes them: category, or category:level for head work', () => {
    expect(planKeys([{ category: 'cylinder-heads', headWork: 'mild-port' }, { category: 'camshaft', headWork: null }, { category: 'camshaft', headWork: null }])).toEqual(['camshaft', 'cylinder-heads:mild-port']);
    expect(planKeys([{ category: 'cylinder-heads', headWork: null }])).toEqual(['cylinder-heads']);
  });
});
