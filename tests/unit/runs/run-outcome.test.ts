import { describe, expect, it } from 'vitest';
import { applyOutcome, outcomeFields } from '@server/modules/runs/run-outcome';
import { failedOutcome, readyOutcome } from './outcome-fixtures';

describe('outcomeFields / applyOutcome', () => {
  it('copies a ready reading into the summary columns, curve and warnings', () => {
    const o = readyOutcome();
    const f = outcomeFields(o);
    expect(f).toMatchObject({
      status: 'ready',
      error: null,
      headerSignature: 'engine speed|torque',
      peakPowerHp: 98.7654,
      peakPowerRpm: 5400,
      peakTorqueLbft: 112.345,
      peakTorqueRpm: 3600,
      rpmMin: 2500,
      rpmMax: 5800,
      points: 412,
      identityStatus: 'derived',
      maxDeviationPct: 0,
      correctionStandard: 'sae-j1349',
      correctionFactor: 1.01234,
      conditions: { temperatureC: 25, baroKpa: 99 },
    });
    expect(f.curve).toBe(o.result!.curve);
    expect(f.warnings.map((w) => w.code)).toEqual(['HUMIDITY_ASSUMED_DRY']);
    // Column roles travel with the units, the confidence and the dropped points.
    expect(f.columns).toEqual({ rpm: 'Engine Speed', torque: 'Torque', units: { torque: 'lbft', power: null }, confidence: 0.9, droppedPoints: 9 });
  });

  it('clears every figure of a run that can no longer be read, keeping the standard and conditions asked for', () => {
    const run = { ...outcomeFields(readyOutcome()), id: 'r1', note: 'kept' };
    applyOutcome(run, failedOutcome());
    expect(run).toMatchObject({
      id: 'r1',
      note: 'kept',
      status: 'failed',
      error: { code: 'NO_SWEEP', message: 'no rising sweep', details: { line: 3 } },
      curve: null,
      peakPowerHp: null,
      peakPowerRpm: null,
      peakTorqueLbft: null,
      peakTorqueRpm: null,
      rpmMin: null,
      rpmMax: null,
      points: null,
      identityStatus: null,
      maxDeviationPct: null,
      correctionStandard: 'iso-1585',
      correctionFactor: null,
      conditions: { temperatureC: 20 },
      columns: null,
      warnings: [],
      headerSignature: 'a|b',
    });
  });

  it('stores a copy of the mapping, so later edits of the input do not reach the run', () => {
    const o = { ...readyOutcome(), mapping: { rpm: 'RPM', torque: { column: 'TQ', unit: 'nm' as const } } };
    const f = outcomeFields(o);
    expect(f.mapping).toEqual({ rpm: 'RPM', torque: { column: 'TQ', unit: 'nm' } });
    o.mapping.rpm = 'changed';
    expect(f.mapping!.rpm).toBe('RPM');
  });

  it('marks a file that needs a hand mapping as needs-mapping', () => {
    expect(outcomeFields(failedOutcome('NEEDS_MAPPING')).status).toBe('needs-mapping');
  });
});
