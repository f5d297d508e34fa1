/**
 * Applying an analysis outcome to a run: status, error, mapping, curve, summary columns and
 * warnings. Pure: `outcomeFields` answers plain data, `applyOutcome` copies it onto a run.
 */
import type { Run } from './run.entity';
import type { AnalysisOutcome } from './run-analysis';

/** The columns of a run that an analysis decides (everything else is the upload's or the user's). */
export type RunOutcomeFields = Pick<
  Run,
  | 'status'
  | 'error'
  | 'mapping'
  | 'headerSignature'
  | 'curve'
  | 'peakPowerHp'
  | 'peakPowerRpm'
  | 'peakTorqueLbft'
  | 'peakTorqueRpm'
  | 'rpmMin'
  | 'rpmMax'
  | 'points'
  | 'identityStatus'
  | 'maxDeviationPct'
  | 'correctionStandard'
  | 'correctionFactor'
  | 'conditions'
  | 'columns'
  | 'warnings'
  | 'rpmPerSpeed'
  | 'pullCount'
  | 'pullStartS'
  | 'pullEndS'
  | 'pullFirstRow'
  | 'pullLastRow'
>;

/**
 * What an outcome writes on a run. A run that could not be read keeps no figures at all (no stale
 * peaks from an earlier reading), but keeps the standard and conditions that were asked for.
 * The pull's index is the run's identity and is set when the run is made, never here.
 */
export function outcomeFields(o: AnalysisOutcome): RunOutcomeFields {
  const r = o.result;
  return {
    status: o.status,
    error: o.error,
    mapping: o.mapping ? { ...o.mapping } : null,
    headerSignature: o.headerSignature,
    curve: r ? r.curve : null,
    peakPowerHp: r ? r.peakPower.hp : null,
    peakPowerRpm: r ? r.peakPower.rpm : null,
    peakTorqueLbft: r ? r.peakTorque.lbft : null,
    peakTorqueRpm: r ? r.peakTorque.rpm : null,
    rpmMin: r ? r.rpmRange[0] : null,
    rpmMax: r ? r.rpmRange[1] : null,
    points: r ? r.points : null,
    identityStatus: r ? r.identity.status : null,
    maxDeviationPct: r ? r.identity.maxDeviationPct : null,
    correctionStandard: r ? r.correction.standard : o.correction,
    correctionFactor: r ? r.correction.factor : null,
    conditions: o.conditions,
    columns: r ? { ...r.columns, units: r.units, confidence: r.confidence, droppedPoints: r.droppedPoints } : null,
    warnings: r ? r.warnings : [],
    rpmPerSpeed: o.rpmPerSpeed ? { ...o.rpmPerSpeed } : null,
    pullCount: o.pullCount,
    pullStartS: r?.pull.timeRange ? r.pull.timeRange[0] : null,
    pullEndS: r?.pull.timeRange ? r.pull.timeRange[1] : null,
    pullFirstRow: r ? r.pull.sampleRange[0] : null,
    pullLastRow: r ? r.pull.sampleRange[1] : null,
  };
}

/** Copy an analysis outcome onto a run (or any object with the run's outcome columns). */
export function applyOutcome<T extends RunOutcomeFields>(run: T, o: AnalysisOutcome): T {
  return Object.assign(run, outcomeFields(o));
}
