/**
 * What changed when a run is re-derived from its raw file: a snapshot of the figures a person
 * reads (rounded as they are shown, so floating-point noise is no change) before and after.
 * Pure; `npm run reprocess` prints it and the audit log keeps it.
 */
import type { AnalysisOutcome } from './run-analysis';
import { outcomeFields, type RunOutcomeFields } from './run-outcome';

export interface ReanalysisChange {
  field: string;
  before: unknown;
  after: unknown;
}

type SnapshotSource = Pick<
  RunOutcomeFields,
  'status' | 'peakPowerHp' | 'peakPowerRpm' | 'peakTorqueLbft' | 'peakTorqueRpm' | 'rpmMin' | 'rpmMax' | 'identityStatus' | 'correctionStandard' | 'correctionFactor' | 'warnings' | 'error' | 'pullCount'
>;

const round = (v: number | null, d: number) => (v === null ? null : Number(v.toFixed(d)));

/** The compared figures: peaks to 0.01, the correction factor to 0.0001, warnings and error by code. */
export function runSnapshot(run: SnapshotSource) {
  return {
    status: run.status,
    peakPowerHp: round(run.peakPowerHp, 2),
    peakPowerRpm: run.peakPowerRpm,
    peakTorqueLbft: round(run.peakTorqueLbft, 2),
    peakTorqueRpm: run.peakTorqueRpm,
    rpmMin: run.rpmMin,
    rpmMax: run.rpmMax,
    identityStatus: run.identityStatus,
    correctionStandard: run.correctionStandard,
    correctionFactor: round(run.correctionFactor, 4),
    warnings: (run.warnings ?? []).map((w) => w.code).join(',') || '-',
    error: run.error?.code ?? '-',
    /** Pulls the raw file reads as (a multi-pull log re-read differently shows here). */
    pullCount: run.pullCount,
  };
}

export type RunSnapshot = ReturnType<typeof runSnapshot>;

/** Fields whose snapshot value differs, in snapshot order. */
export function diffSnapshots(before: RunSnapshot, after: RunSnapshot): ReanalysisChange[] {
  return (Object.keys(before) as (keyof RunSnapshot)[]).filter((k) => before[k] !== after[k]).map((k) => ({ field: k, before: before[k], after: after[k] }));
}

/** What applying `outcome` would change on a run as it is stored now. */
export function reanalysisChanges(run: SnapshotSource, outcome: AnalysisOutcome): ReanalysisChange[] {
  return diffSnapshots(runSnapshot(run), runSnapshot(outcomeFields(outcome)));
}
