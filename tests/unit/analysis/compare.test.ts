import { describe, expect, it } from 'vitest';
import { AnalysisError, type NormalizedCurve, applyCorrection, compareCurves, integrate, peaksOf, repeatability } from '@shared/analysis/index';
import { analyzeBuffer } from '@shared/analysis/index';
import { syntheticRunFile } from '@server/db/synthetic-runs';

/** A straight-line test curve: hp = a + b·rpm on a 50 rpm grid (values chosen by hand). */
function line(from: number, to: number, a: number, b: number): NormalizedCurve {
  const rpm: number[] = [];
  for (let r = from; r <= to; r += 50) rpm.push(r);
  const powerHp = rpm.map((r) => a + b * r);
  return { rpm, powerHp, torqueLbft: powerHp.map((p, i) => (p * 5252.113) / rpm[i]), afr: {} };
}

describe('compareCurves', () => {
  it('a constant +5 hp gain gives +5 hp average and in every band', () => {
    const base = line(2000, 6000, 10, 0.01);
    const other = { ...base, powerHp: base.powerHp.map((p) => p + 5) };
    const f = compareCurves(base, other);
    expect(f.averagePowerGainHp).toBeCloseTo(5, 9);
    expect(f.bands.map((b) => [b.from, b.to])).toEqual([[2000, 3000], [3000, 4000], [4000, 5000], [5000, 6000]]);
    f.bands.forEach((b) => expect(b.averagePowerGainHp).toBeCloseTo(5, 9));
    expect(f.peakPowerGain.hp).toBeCloseTo(5, 9);
    // Peak 70 hp at 6000 rpm → 75 hp: +7.142857 % (hand calculation 5/70).
    expect(f.peakPowerGain.pct).toBeCloseTo((5 / 70) * 100, 9);
  });

  it('area gain of a proportional gain equals the proportion; average is ∫Δ/width', () => {
    const base = line(2500, 5500, 20, 0.012);
    const other = applyCorrection(base, 1.06);
    const f = compareCurves(base, other);
    expect(f.areaGainPct).toBeCloseTo(6, 9);
    // ∫(0.06·(20 + 0.012 r)) dr from 2500 to 5500 ÷ 3000 = 0.06·(20 + 0.012·4000) = 4.08 hp (hand calculation).
    expect(f.averagePowerGainHp).toBeCloseTo(4.08, 9);
    expect(f.largestGain.rpm).toBe(5500);
    // Gained everywhere: largestLoss is the smallest change, hp > 0 — here at the bottom of the
    // range, 0.06·(20 + 0.012·2500) = 3 hp at 2500 rpm (hand calculation).
    expect(f.largestLoss).toEqual({ rpm: 2500, hp: expect.closeTo(3, 9) });
  });

  it('uses the common range, aligns bands to whole multiples and clips them', () => {
    const base = line(2150, 6000, 30, 0.01);
    const other = line(2000, 5700, 30, 0.01);
    const f = compareCurves(base, other, { bandWidthRpm: 1000 });
    expect(f.commonRpm).toEqual([2150, 5700]);
    expect(f.bands[0]).toMatchObject({ from: 2150, to: 3000 });
    expect(f.bands[f.bands.length - 1]).toMatchObject({ from: 5000, to: 5700 });
    expect(compareCurves(base, other, { bandWidthRpm: 500 }).bands[1]).toMatchObject({ from: 2500, to: 3000 });
  });

  it('finds the largest gain and the largest loss with their rpm', () => {
    const base = line(2000, 6000, 40, 0);
    const other = { ...base, powerHp: base.rpm.map((r) => 40 + 3 * Math.sin(((r - 2000) / 4000) * 2 * Math.PI)) };
    const f = compareCurves(base, other);
    expect(f.largestGain).toEqual({ rpm: 3000, hp: expect.closeTo(3, 9) });
    expect(f.largestLoss).toEqual({ rpm: 5000, hp: expect.closeTo(-3, 9) });
    expect(f.averagePowerGainHp).toBeCloseTo(0, 6);
  });

  it('throws NO_COMMON_RANGE for runs that do not overlap', () => {
    expect(() => compareCurves(line(2000, 3000, 1, 0.01), line(3500, 5000, 1, 0.01))).toThrow(AnalysisError);
  });

  it('reports a 6 % synthetic gain between two analysed runs', () => {
    const before = analyzeBuffer(syntheticRunFile({ seed: 31, torqueNoise: 0.05 }).bytes);
    const after = analyzeBuffer(syntheticRunFile({ seed: 32, torqueNoise: 0.05, gain: 1.06 }, { delimiter: ';', decimalComma: true, torqueUnit: 'nm', powerUnit: 'kw' }).bytes);
    const f = compareCurves(before.curve, after.curve);
    expect(f.peakPowerGain.pct).toBeGreaterThan(5.5);
    expect(f.peakPowerGain.pct).toBeLessThan(6.5);
    expect(f.areaGainPct).toBeGreaterThan(5.5);
    expect(f.areaGainPct).toBeLessThan(6.5);
  });

  it('integrate is the trapezoid rule with clipped limits', () => {
    // ∫ x dx from 1 to 3 = 4 (exact for a straight line).
    expect(integrate([0, 2, 4], [0, 2, 4], 1, 3)).toBeCloseTo(4, 12);
  });
});

describe('repeatability', () => {
  it('gives the spread of peaks, the mean curve and the largest deviation from it', () => {
    const a = line(2000, 6000, 10, 0.01);
    const b = { ...a, powerHp: a.powerHp.map((p) => p + 1) };
    const c = { ...a, powerHp: a.powerHp.map((p, i) => p + (a.rpm[i] === 4000 ? 5 : 2)) };
    const r = repeatability([a, b, c]);
    expect(r.runs).toBe(3);
    expect(r.peakPowerSpreadHp).toBeCloseTo(2, 9);
    expect(r.meanCurve.powerHp[0]).toBeCloseTo(a.powerHp[0] + 1, 9);
    expect(r.largestDeviationRpm).toBe(4000);
    // Mean at 4000: +2 above a; c is +5 → deviation 3 hp.
    expect(r.largestDeviationHp).toBeCloseTo(3, 9);
    expect(peaksOf(r.meanCurve).peakPower.rpm).toBe(6000);
  });
});
