import { describe, expect, it } from 'vitest';
import { fairnessWarnings, prepare } from '@server/modules/comparisons/engine';
import { engineRun, flatTorque } from './engine-runs';

const codes = (ws: { code: string }[]) => ws.map((w) => w.code);

describe('comparison engine: fairness warnings', () => {
  it('gives no warning for two like-for-like runs', () => {
    const all = [prepare(engineRun({ id: 'a' }), {}), prepare(engineRun({ id: 'b' }), {})];
    expect(fairnessWarnings(all, all[0])).toEqual([]);
  });

  it('flags air temperatures more than 10 °C apart in both units (Δ°F = Δ°C × 1.8, NIST SP 811)', () => {
    const a = prepare(engineRun({ id: 'a', label: 'Cold', conditions: { temperatureC: 15 } }), {});
    const b = prepare(engineRun({ id: 'b', label: 'Hot', conditions: { temperatureC: 30 } }), {});
    const [w] = fairnessWarnings([a, b], a);
    expect(w.code).toBe('TEMPERATURE_APART');
    // 15 K apart = 27 °F apart; 15 °C = 59 °F, 30 °C = 86 °F (°F = °C × 1.8 + 32).
    expect(w.message).toContain('differs by 15.0 °C / 27.0 °F');
    expect(w.message).toContain('15.0 °C / 59.0 °F for “Cold”');
    expect(w.message).toContain('30.0 °C / 86.0 °F for “Hot”');
    expect(w.runIds).toEqual(['a', 'b']);
    // 10 °C apart is still fine.
    const c = prepare(engineRun({ id: 'c', conditions: { temperatureC: 25 } }), {});
    expect(fairnessWarnings([a, c], a)).toEqual([]);
  });

  it('flags pressure more than 3 kPa apart (1 inHg = 3.38638 kPa, NIST SP 811)', () => {
    const a = prepare(engineRun({ id: 'a', conditions: { baroKpa: 95 } }), {});
    const b = prepare(engineRun({ id: 'b', conditions: { baroKpa: 100 } }), {});
    const [w] = fairnessWarnings([a, b], a);
    expect(w.code).toBe('PRESSURE_APART');
    expect(w.message).toContain(`differs by 5.0 kPa / ${(5 / 3.38638).toFixed(2)} inHg`);
    expect(w.message).toContain('5.0 kPa / 1.48 inHg');
  });

  it('flags different dynos, mixed standards, failed cross-checks and several bikes', () => {
    const a = prepare(engineRun({ id: 'a', correctionStandard: 'sae-j1349', correctionFactor: 1.01 }), {});
    const other = engineRun({ id: 'b', correctionStandard: 'din-70020', correctionFactor: 1.03, identityStatus: 'mismatch', bike: { id: 'bike-2', make: 'Acme', model: 'Tour', year: 2019 } });
    other.session = { ...other.session!, dyno: { id: 'dyno-2', name: 'Bay 2' } };
    const b = prepare(other, {});
    const ws = fairnessWarnings([a, b], a);
    expect(codes(ws)).toEqual(['MIXED_CORRECTION', 'DIFFERENT_DYNOS', 'CROSS_CHECK_MISMATCH', 'SEVERAL_BIKES']);
    expect(ws[0].message).toContain('(SAE J1349, DIN 70020)');
    expect(ws[1].message).toContain('(Bay 1, Bay 2)');
    expect(ws[3].message).toContain('from 2 different bikes');
  });

  it('asks to check the dyno when only some runs have one', () => {
    const a = prepare(engineRun({ id: 'a' }), {});
    const b = prepare(engineRun({ id: 'b', label: 'Loose file', session: null }), {});
    const ws = fairnessWarnings([a, b], a);
    expect(codes(ws)).toEqual(['DYNO_UNKNOWN']);
    expect(ws[0].message).toContain('“Loose file”');
    expect(ws[0].runIds).toEqual(['b']);
  });

  it('flags little overlap: 2,000–6,000 against 5,000–9,000 rpm share 1,000 rpm = 25 % of the narrower 4,000 (by hand)', () => {
    const a = prepare(engineRun({ id: 'a' }), {});
    const b = prepare(engineRun({ id: 'b', curve: flatTorque(100, 5000, 9000) }), {});
    const ws = fairnessWarnings([a, b], a);
    expect(codes(ws)).toEqual(['LITTLE_OVERLAP']);
    expect(ws[0].message).toContain('share only 1000 rpm (25 %');
    // Half the range shared is enough (MIN_OVERLAP_FRACTION 0.5, our own threshold).
    const c = prepare(engineRun({ id: 'c', curve: flatTorque(100, 4000, 8000) }), {});
    expect(fairnessWarnings([a, c], a)).toEqual([]);
  });

  it("puts each run's own warnings first", () => {
    const a = prepare(engineRun({ id: 'a', conditions: { temperatureC: 20, baroKpa: 99 } }), { correction: 'sae-j1349' });
    const b = prepare(engineRun({ id: 'b' }), { correction: 'sae-j1349' });
    const ws = fairnessWarnings([a, b], a);
    expect(ws[0].code).toBe('CONDITIONS_MISSING');
    expect(ws[0].runIds).toEqual(['b']);
    expect(codes(ws)).toContain('MIXED_CORRECTION');
  });

  it('names runs the run-file engine flagged: review, dropped glitches, partial pull, engine speed from road speed', () => {
    const review = prepare(engineRun({ id: 'r', label: 'Spiky', warnings: [{ code: 'GLITCHES_DROPPED' }, { code: 'GLITCHES_REVIEW' }] }), {});
    const glitchy = prepare(engineRun({ id: 'g', label: 'Few spikes', warnings: [{ code: 'GLITCHES_DROPPED' }] }), {});
    const partial = prepare(engineRun({ id: 'p', label: 'Short', warnings: [{ code: 'PULL_PARTIAL' }, { code: 'PULLS_FOUND' }] }), {});
    const speed = prepare(engineRun({ id: 's', label: 'Road', warnings: [{ code: 'RPM_FROM_SPEED' }] }), {});
    const clean = prepare(engineRun({ id: 'c', warnings: [{ code: 'PULLS_FOUND' }] }), {});
    const ws = fairnessWarnings([clean, review, glitchy, partial, speed], clean);
    expect(codes(ws)).toEqual(['RUN_NEEDS_REVIEW', 'GLITCHES_DROPPED', 'PARTIAL_PULL', 'RPM_FROM_SPEED']);
    // A run marked for review is named once, under review, not again for its dropped glitches.
    expect(ws.map((w) => w.runIds)).toEqual([['r'], ['g'], ['p'], ['s']]);
    expect(ws[0].message).toContain('“Spiky” is marked for review');
    // Only the pull-count note on clean runs: nothing to warn about.
    expect(fairnessWarnings([clean, prepare(engineRun({ id: 'd', warnings: [{ code: 'PULLS_FOUND' }] }), {})], clean)).toEqual([]);
  });
});
