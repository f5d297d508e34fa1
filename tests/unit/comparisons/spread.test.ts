import { describe, expect, it } from 'vitest';
import { bandKey, maxKnown, prepare, stageSpreads, within } from '@server/modules/comparisons/engine';
import { HP_CONSTANT, engineRun, flatTorque } from './engine-runs';

const stage = { id: 'stage-1', name: 'Stage 1', position: 1 };

describe('comparison engine: run-to-run spread', () => {
  it('measures a stage by its own runs: 100 and 102 lb·ft flat (power is linear in rpm, so the averages are exact by hand)', () => {
    // Newest first, as the read model gives them.
    const runs = [engineRun({ id: 'new', stage, curve: flatTorque(100) }), engineRun({ id: 'old', stage, curve: flatTorque(102) })];
    const spreads = stageSpreads(runs, ['stage-1'], {}, new Map());
    const s = spreads.get('stage-1')!;
    expect(s.info.runIds).toEqual(['new', 'old']);
    expect(s.info.runs).toBe(2);
    // Peak power at 6,000 rpm differs by 2 × 6000 / 5252.113 = 2.2848 hp.
    expect(s.info.peakPowerSpreadHp).toBeCloseTo((2 * 6000) / HP_CONSTANT, 4);
    expect(s.info.peakTorqueSpreadLbft).toBeCloseTo(2, 4);
    // Average power over 2,000–6,000 rpm differs by 2 × 4000 (the mean rpm) / 5252.113 = 1.5232 hp.
    expect(s.info.averagePowerSpreadHp).toBeCloseTo((2 * 4000) / HP_CONSTANT, 4);
    // Band 5,000–6,000 rpm: 2 × 5500 / 5252.113 = 2.0944 hp.
    expect(s.bands.get(5000)).toBeCloseTo((2 * 5500) / HP_CONSTANT, 6);
    // Each run deviates from the mean by 1 lb·ft, most at 6,000 rpm: 6000 / 5252.113 = 1.1424 hp.
    expect(s.info.largestDeviationHp).toBeCloseTo(6000 / HP_CONSTANT, 4);
    expect(s.info.largestDeviationRpm).toBe(6000);
  });

  it('needs two ready runs with curves in the stage', () => {
    const runs = [engineRun({ id: 'a', stage }), engineRun({ id: 'b', stage, status: 'failed', curve: null }), engineRun({ id: 'c' })];
    expect(stageSpreads(runs, ['stage-1'], {}, new Map()).size).toBe(0);
    expect(stageSpreads(runs, [], {}, new Map()).size).toBe(0);
  });

  it('counts only the newest 12 runs of a stage (MAX_STAGE_RUNS, our own limit)', () => {
    const runs = Array.from({ length: 14 }, (_, i) => engineRun({ id: `r${i}`, stage, curve: flatTorque(100 + i) }));
    const s = stageSpreads(runs, ['stage-1'], {}, new Map()).get('stage-1')!;
    expect(s.info.runs).toBe(12);
    expect(s.info.peakTorqueSpreadLbft).toBeCloseTo(11, 6); // 100 … 111 lb·ft
  });

  it('reuses runs already prepared with the same options', () => {
    const a = engineRun({ id: 'a', stage, curve: flatTorque(100) });
    const b = engineRun({ id: 'b', stage, curve: flatTorque(104) });
    // A prepared 'a' that claims 90 lb·ft proves the known copy is used, not the row.
    const known = prepare({ ...a, curve: flatTorque(90) }, {});
    const s = stageSpreads([a, b], ['stage-1'], {}, new Map([['a', known]])).get('stage-1')!;
    expect(s.info.peakTorqueSpreadLbft).toBeCloseTo(14, 6);
  });

  it('judges a gain against the larger known spread', () => {
    expect(maxKnown(1.2, 0.8)).toBe(1.2);
    expect(maxKnown(undefined, 0.8)).toBe(0.8);
    expect(maxKnown(null, undefined)).toBeNull();
    expect(within(1.0, 1.5)).toBe(true);
    expect(within(-1.5, 1.5)).toBe(true);
    expect(within(2.0, 1.5)).toBe(false);
    expect(within(2.0, null)).toBeNull();
    expect(bandKey(2250, 1000)).toBe(2000);
    expect(bandKey(5000, 500)).toBe(5000);
  });
});
