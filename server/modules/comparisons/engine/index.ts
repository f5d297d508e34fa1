/**
 * The comparison engine: pure functions over plain run data (no ORM entities, no database, no
 * HTTP). The use cases in ../ load runs, call {@link computeComparison} and answer.
 */
export { computeComparison, type ComparisonRequest } from './compute';
export { ComparisonEngineError, isComparisonEngineError } from './errors';
export { fairnessWarnings } from './fairness';
export { bikeLabel, r3, r4, runName, standardLabel } from './labels';
export { alignedCurves, clip, compareOrThrow, conditionsOf, prepare } from './prepare';
export { MOST_OF_GAIN, NOTABLE_LOSS_HP, describeResult, summarySentences } from './sentences';
export { bandKey, maxKnown, stageSpreads, within, type StageSpread } from './spread';
export { DEFAULT_BAND_WIDTH, MAX_STAGE_RUNS, type EngineCurve, type EngineRun, type Prepared } from './types';
