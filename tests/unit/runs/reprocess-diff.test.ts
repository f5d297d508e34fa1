import { describe, expect, it } from 'vitest';
import { diffSnapshots, reanalysisChanges, runSnapshot } from '@server/modules/runs/reprocess-diff';
import { outcomeFields } from '@server/modules/runs/run-outcome';
import { failedOutcome, readyOutcome } from './outcome-fixtures';

// Rounded values below are worked by hand (decimal rounding to the shown places).
describe('reprocess diff', () => {
  it('reports nothing when a run is re-derived to the same figures', () => {
    const stored = outcomeFields(readyOutcome());
    expect(reanalysisChanges(stored, readyOutcome())).toEqual([]);
  });

  it('names a changed peak with the values rounded as shown (0.01 hp)', () => {
    const stored = { ...outcomeFields(readyOutcome()), peakPowerHp: 1 };
    expect(reanalysisChanges(stored, readyOutcome())).toEqual([{ field: 'peakPowerHp', before: 1, after: 98.77 }]);
  });

  it('ignores differences below the shown precision and catches those above it', () => {
    // 98.761 and 98.7649 both show as 98.76; correction factors 1.01234 → 1.0123, 1.01236 → 1.0124.
    const stored = { ...outcomeFields(readyOutcome()), peakPowerHp: 98.761 };
    expect(reanalysisChanges(stored, readyOutcome({ peakPower: { hp: 98.7649, rpm: 5400 } }))).toEqual([]);
    const factorMoved = reanalysisChanges(stored, readyOutcome({ peakPower: { hp: 98.7649, rpm: 5400 }, correction: { standard: 'sae-j1349', factor: 1.01236 } }));
    expect(factorMoved).toEqual([{ field: 'correctionFactor', before: 1.0123, after: 1.0124 }]);
  });

  it('lists status, figures, warnings and error, in snapshot order, when a run stops reading', () => {
    const changes = reanalysisChanges(outcomeFields(readyOutcome()), failedOutcome());
    expect(changes.map((c) => c.field)).toEqual(['status', 'peakPowerHp', 'peakPowerRpm', 'peakTorqueLbft', 'peakTorqueRpm', 'rpmMin', 'rpmMax', 'identityStatus', 'correctionStandard', 'correctionFactor', 'warnings', 'error']);
    expect(changes.find((c) => c.field === 'warnings')).toEqual({ field: 'warnings', before: 'HUMIDITY_ASSUMED_DRY', after: '-' });
    expect(changes.find((c) => c.field === 'error')).toEqual({ field: 'error', before: '-', after: 'NO_SWEEP' });
  });

  it('compares warnings by their codes, not their wording', () => {
    const a = runSnapshot({ ...outcomeFields(readyOutcome()), warnings: [{ code: 'UNCORRECTED', message: 'one wording' }] });
    const b = runSnapshot({ ...outcomeFields(readyOutcome()), warnings: [{ code: 'UNCORRECTED', message: 'another wording' }] });
    expect(diffSnapshots(a, b)).toEqual([]);
    const c = runSnapshot({ ...outcomeFields(readyOutcome()), warnings: [{ code: 'UNCORRECTED', message: '' }, { code: 'HUMIDITY_ASSUMED_DRY', message: '' }] });
    expect(diffSnapshots(a, c)).toEqual([{ field: 'warnings', before: 'UNCORRECTED', after: 'UNCORRECTED,HUMIDITY_ASSUMED_DRY' }]);
  });
});
