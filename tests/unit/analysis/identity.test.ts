import { describe, expect, it } from 'vitest';
import { HP_TORQUE_CONSTANT, analyzeBuffer, identityStats } from '@shared/analysis/index';
import { syntheticRunFile } from '@server/db/synthetic-runs';

const QUIET = { seed: 21, rpmNoise: 2, torqueNoise: 0.05 };
const enc = (s: string) => new TextEncoder().encode(s);

describe('cross-check power = torque × rpm / 5252.113', () => {
  it('is ok for consistent data, with a small deviation', () => {
    const r = analyzeBuffer(syntheticRunFile(QUIET).bytes);
    expect(r.identity.status).toBe('ok');
    expect(r.identity.medianDeviationPct).toBeLessThan(0.1);
  });

  it('computes the per-point deviation from the identity (hand example)', () => {
    // 100 lb·ft at 5252.113 rpm is 100 hp; 102 hp is a 1.96 % deviation (2/102).
    const s = identityStats([HP_TORQUE_CONSTANT, HP_TORQUE_CONSTANT, HP_TORQUE_CONSTANT], [100, 100, 100], [100, 102, 100]);
    expect(s.medianDeviationPct).toBeCloseTo(0, 9);
    expect(s.maxDeviationPct).toBeCloseTo((2 / 102) * 100, 9);
  });

  it('detects power labelled hp that is really kW, says so, and corrects it', () => {
    const { bytes } = syntheticRunFile(QUIET, { powerUnit: 'kw', labelPowerUnit: 'hp' });
    const r = analyzeBuffer(bytes);
    const w = r.warnings.find((x) => x.code === 'UNIT_CORRECTED');
    expect(w?.message).toMatch(/power is in kw/);
    expect(r.units.power).toBe('kw');
    expect(r.identity.status).toBe('ok');
    const truth = analyzeBuffer(syntheticRunFile(QUIET).bytes);
    expect(r.peakPower.hp).toBeCloseTo(truth.peakPower.hp, 1);
  });

  it('detects torque labelled lb·ft that is really N·m', () => {
    const { bytes } = syntheticRunFile(QUIET, { torqueUnit: 'nm', labelTorqueUnit: 'lbft' });
    const r = analyzeBuffer(bytes);
    expect(r.warnings.find((x) => x.code === 'UNIT_CORRECTED')?.message).toMatch(/torque is in nm/);
    expect(r.units.torque).toBe('nm');
  });

  it('flags PS labelled as hp (1.4 % apart, inside the tolerance) as suspect without changing it', () => {
    const { bytes } = syntheticRunFile(QUIET, { powerUnit: 'ps', labelPowerUnit: 'hp' });
    const r = analyzeBuffer(bytes);
    expect(r.identity.status).toBe('ok');
    expect(r.warnings.map((w) => w.code)).toContain('UNIT_SUSPECT');
    expect(r.units.power).toBe('hp');
  });

  it('recognises a speed column that is not engine rpm and does not correct it', () => {
    // Roller rpm = engine rpm / 2.9 (invented gearing), labelled as engine speed.
    const { run } = syntheticRunFile(QUIET);
    const rows = run.samples.map((s) => `${(s.rpm / 2.9).toFixed(1)},${s.torqueLbft.toFixed(3)},${s.powerHp.toFixed(3)}`);
    const r = analyzeBuffer(enc(['Engine Speed [rpm],Torque [lb-ft],Power [hp]', ...rows].join('\n')), { gridRpm: 20 });
    expect(r.identity.status).toBe('mismatch');
    const w = r.warnings.find((x) => x.code === 'RPM_NOT_ENGINE_SPEED');
    expect(w?.message).toMatch(/2\.9/);
  });

  it('reports an unexplained mismatch, never silently', () => {
    const { run } = syntheticRunFile(QUIET);
    const rows = run.samples.map((s, i) => `${s.rpm.toFixed(0)},${s.torqueLbft.toFixed(2)},${(s.powerHp * (1 + 0.1 * Math.sin(i))).toFixed(2)}`);
    const r = analyzeBuffer(enc(['RPM,Torque [lb-ft],Power [hp]', ...rows].join('\n')));
    expect(r.identity.status).toBe('mismatch');
    expect(r.identity.maxDeviationPct).toBeGreaterThan(5);
    expect(r.warnings.map((w) => w.code)).toContain('IDENTITY_MISMATCH');
  });
});
