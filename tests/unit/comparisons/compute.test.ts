import { describe, expect, it } from 'vitest';
import { ComparisonEngineError, computeComparison } from '@server/modules/comparisons/engine';
import { HP_CONSTANT, engineRun, flatTorque } from './engine-runs';

const base = { id: 'stage-0', name: 'Baseline', position: 0 };
const tuned = { id: 'stage-1', name: 'Stage 1', position: 1 };

describe('comparison engine: a whole comparison from plain runs', () => {
  it('compares 105 against 100 lb·ft flat over 2,000–6,000 rpm (figures worked by hand)', () => {
    const rows = [engineRun({ id: 'b', stage: tuned, sequence: 1, curve: flatTorque(105) }), engineRun({ id: 'a', stage: base, sequence: 1, curve: flatTorque(100) })];
    const out = computeComparison(rows, { runIds: ['a', 'b'], baselineRunId: 'a', options: {} });
    expect(out.baseline.runId).toBe('a');
    expect(out.runs.map((r) => r.runId)).toEqual(['a', 'b']);
    const [r] = out.results;
    // Peak power at 6,000 rpm: 5 lb·ft × 6000 / 5252.113 = 5.7121 hp, +5 %.
    expect(r.peakPowerGain.hp).toBeCloseTo((5 * 6000) / HP_CONSTANT, 4);
    expect(r.peakPowerGain.pct).toBeCloseTo(5, 4);
    expect(r.peakTorqueGain).toEqual({ lbft: 5, pct: 5 });
    expect(r.areaGainPct).toBeCloseTo(5, 4);
    // Average over the range: 5 × 4000 (mean rpm) / 5252.113 = 3.8080 hp.
    expect(r.averagePowerGainHp).toBeCloseTo((5 * 4000) / HP_CONSTANT, 4);
    expect(r.bands.map((b) => [b.from, b.to])).toEqual([
      [2000, 3000],
      [3000, 4000],
      [4000, 5000],
      [5000, 6000],
    ]);
    expect(r.bands[0].averagePowerGainHp).toBeCloseTo((5 * 2500) / HP_CONSTANT, 4);
    // No stage has two runs: the spread is unknown and the summary says so.
    expect(r.withinRepeatability).toEqual({ peakPower: null, peakTorque: null, averagePower: null });
    expect(out.repeatability).toEqual([]);
    expect(out.summary.at(-1)).toBe('No stage in this comparison has two or more runs, so run-to-run spread is unknown; treat small differences with care.');
    expect(out.summary[0]).toBe(r.sentences[0]);
    expect(r.sentences[0]).toMatch(/^\+5\.7 hp at peak \(\+5\.0 %\)/);
    expect(out.warnings).toEqual([]);
    expect(out.options).toEqual({ correction: null, smooth: 0, units: 'hp-lbft', rpmRange: null, bandWidthRpm: 1000 });
    // Curves on one grid of the finest step (250 rpm): 2,000 … 6,000 = 17 points.
    expect(out.curves.rpm).toHaveLength(17);
    expect(out.curves.runs[1].torqueLbft.every((v) => v === 105)).toBe(true);
  });

  it("colours runs by their place in the bike's archive unless a saved comparison keeps its own", () => {
    const rows = [
      engineRun({ id: 'b', stage: tuned, sequence: 1, curve: flatTorque(105) }),
      engineRun({ id: 'x', stage: base, sequence: 2 }),
      engineRun({ id: 'a', stage: base, sequence: 1 }),
    ];
    // Archive order: Baseline run 1 (a), Baseline run 2 (x), Stage 1 run 1 (b) → slots 0, 1, 2.
    const fresh = computeComparison(rows, { runIds: ['b', 'a'], baselineRunId: 'a', options: {} });
    expect(Object.fromEntries(fresh.runs.map((r) => [r.runId, r.colorIndex]))).toEqual({ a: 0, b: 2 });
    const kept = computeComparison(rows, { runIds: ['b', 'a'], baselineRunId: 'a', options: {}, colorSlots: { a: 5, b: 6 } });
    expect(Object.fromEntries(kept.runs.map((r) => [r.runId, r.colorIndex]))).toEqual({ a: 5, b: 6 });
    // Slots for only some runs (saved before slots were kept): all come from the archive.
    const partial = computeComparison(rows, { runIds: ['b', 'a'], baselineRunId: 'a', options: {}, colorSlots: { a: 5 } });
    expect(partial.runs.map((r) => r.colorIndex)).toEqual([2, 0]);
  });

  it('judges the gain against the stage spread when a stage has two runs', () => {
    const rows = [
      engineRun({ id: 'b', stage: tuned, curve: flatTorque(101) }),
      engineRun({ id: 'a2', stage: base, curve: flatTorque(98) }),
      engineRun({ id: 'a', stage: base, curve: flatTorque(100) }),
    ];
    const out = computeComparison(rows, { runIds: ['a', 'b'], baselineRunId: 'a', options: {} });
    expect(out.repeatability.map((s) => s.stageId)).toEqual(['stage-0']);
    const [r] = out.results;
    // Spread of the baseline stage's peak power: 2 × 6000 / 5252.113 = 2.2848 hp; the gain is
    // 1 × 6000 / 5252.113 = 1.1424 hp, within it.
    expect(r.spread.peakPowerHp).toBeCloseTo((2 * 6000) / HP_CONSTANT, 4);
    expect(r.withinRepeatability.peakPower).toBe(true);
    expect(r.bands.every((b) => b.withinRepeatability === true)).toBe(true);
    expect(r.sentences[0]).toContain('across the whole range the change is within run-to-run spread');
  });

  it('names both runs when they share no rpm range', () => {
    const rows = [engineRun({ id: 'a', label: 'Low', curve: flatTorque(100, 2000, 4000) }), engineRun({ id: 'b', label: 'High', curve: flatTorque(100, 5000, 8000) })];
    const run = () => computeComparison(rows, { runIds: ['a', 'b'], baselineRunId: 'a', options: {} });
    expect(run).toThrow(ComparisonEngineError);
    expect(run).toThrow(/“High” and the baseline “Low”/);
  });

  it('refuses runs it was not given', () => {
    expect(() => computeComparison([engineRun({ id: 'a' })], { runIds: ['a', 'b'], baselineRunId: 'a', options: {} })).toThrow(expect.objectContaining({ code: 'NOT_FOUND' }));
  });
});
