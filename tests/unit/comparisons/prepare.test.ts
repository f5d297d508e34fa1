import { describe, expect, it } from 'vitest';
import { ComparisonEngineError, conditionsOf, prepare } from '@server/modules/comparisons/engine';
import { HP_CONSTANT, engineRun, flatTorque } from './engine-runs';

describe('comparison engine: prepare', () => {
  it('keeps the stored correction when no standard is chosen (hp = lbf·ft × rpm / 5252.113, 1 hp = 550 ft·lbf/s)', () => {
    const p = prepare(engineRun({ id: 'a', curve: flatTorque(100), correctionStandard: 'din-70020', correctionFactor: 1.05 }), {});
    expect(p.summary.correction).toEqual({ standard: 'din-70020', factor: 1.05, source: 'stored' });
    // 100 lb·ft × 1.05 at 6,000 rpm: 105 × 6000 / 5252.113 = 119.952 hp (worked by hand).
    expect(p.summary.peakPower.rpm).toBe(6000);
    expect(p.summary.peakPower.hp).toBeCloseTo((105 * 6000) / HP_CONSTANT, 3);
    expect(p.summary.peakPower.hp).toBeCloseTo(119.952, 3);
    expect(p.curve.torqueLbft[0]).toBeCloseTo(105, 9);
    expect(p.warnings).toEqual([]);
  });

  it('recomputes the factor at SAE J1349 reference air (25 °C, 99 kPa dry) as exactly 1', () => {
    const p = prepare(engineRun({ id: 'a', conditions: { temperatureC: 25, baroKpa: 99, humidityPct: 0 } }), { correction: 'sae-j1349' });
    expect(p.summary.correction).toEqual({ standard: 'sae-j1349', factor: 1, source: 'recomputed' });
  });

  it('recomputes SAE J1349 away from reference: CF = 1.176 · (99/Pd) · √(T/298.15) − 0.176 (SAE J1349, formula from memory)', () => {
    const p = prepare(engineRun({ id: 'a', conditions: { temperatureC: 35, baroKpa: 97, humidityPct: 0 } }), { correction: 'sae-j1349' });
    const expected = 1.176 * (99 / 97) * Math.sqrt((35 + 273.15) / (25 + 273.15)) - 0.176; // = 1.04422 worked by hand
    expect(expected).toBeCloseTo(1.04422, 4);
    expect(p.summary.correction.factor).toBeCloseTo(expected, 4);
    expect(p.summary.peakTorque.lbft).toBeCloseTo(100 * expected, 3);
  });

  it('falls back to the stored factor with a CONDITIONS_MISSING warning when the air was not recorded', () => {
    const p = prepare(engineRun({ id: 'a', label: 'Pull 3', correctionStandard: 'sae-j1349', correctionFactor: 1.02 }), { correction: 'din-70020' });
    expect(p.summary.correction).toEqual({ standard: 'sae-j1349', factor: 1.02, source: 'fallback' });
    expect(p.warnings).toHaveLength(1);
    expect(p.warnings[0].code).toBe('CONDITIONS_MISSING');
    expect(p.warnings[0].message).toContain('“Pull 3” cannot be corrected to DIN 70020');
    expect(p.warnings[0].message).toContain('(SAE J1349, factor 1.020)');
  });

  it("takes the session's air for what the run's own file lacked", () => {
    const run = engineRun({ id: 'a', conditions: { temperatureC: 18 } });
    run.session = { ...run.session!, ambientTempC: 30, baroKpa: 98.2, humidityPct: 40 };
    expect(conditionsOf(run)).toEqual({ temperatureC: 18, baroKpa: 98.2, humidityPct: 40 });
  });

  it('finds peaks inside the rpm range only: 100 lb·ft at 4,000 rpm = 76.160 hp (by hand)', () => {
    const p = prepare(engineRun({ id: 'a' }), { rpmRange: [2000, 4000] });
    expect(p.summary.peakPower.rpm).toBe(4000);
    expect(p.summary.peakPower.hp).toBeCloseTo((100 * 4000) / HP_CONSTANT, 3);
    expect(p.summary.peakPower.hp).toBeCloseTo(76.16, 2);
    // The curve itself is not cut: the chart still shows the whole run.
    expect(p.summary.rpmMax).toBe(6000);
  });

  it('names runs by label, else stage and sequence', () => {
    expect(prepare(engineRun({ id: 'a', label: 'Baseline pull' }), {}).summary.name).toBe('Baseline pull');
    expect(prepare(engineRun({ id: 'b', sequence: 2, stage: { id: 's', name: 'Stage 1', position: 1 } }), {}).summary.name).toBe('Stage 1 · pull 2');
    expect(prepare(engineRun({ id: 'c', sequence: 4 }), {}).summary.name).toBe('No stage · pull 4');
  });

  it('carries the run’s file as secondary text, with the pull of a log that held several', () => {
    expect(prepare(engineRun({ id: 'd', file: { originalName: 'pull-07.csv', pullIndex: 0, pullCount: 1 } }), {}).summary.fileName).toBe('pull-07.csv');
    expect(prepare(engineRun({ id: 'e', file: { originalName: 'day.log', pullIndex: 2, pullCount: 3 } }), {}).summary.fileName).toBe('day.log · pull 3 of 3');
    expect(prepare(engineRun({ id: 'f' }), {}).summary.fileName).toBeNull();
  });

  it('refuses a run without an analysed curve with a typed RUN_NOT_READY error', () => {
    const run = engineRun({ id: 'x', status: 'needs-mapping', curve: null, label: 'Raw file' });
    expect(() => prepare(run, {})).toThrow(ComparisonEngineError);
    try {
      prepare(run, {});
    } catch (e) {
      expect((e as ComparisonEngineError).code).toBe('RUN_NOT_READY');
      expect((e as ComparisonEngineError).details).toEqual({ runId: 'x' });
    }
  });
});
