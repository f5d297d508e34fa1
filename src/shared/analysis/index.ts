/**
 * Run-file ingest engine: read the files dynos export, normalise them, cross-check power against
 * torque × rpm, correct to standard air, and compare runs. Pure functions; no database or HTTP.
 *
 * Everything exported here is pure (no I/O, no Node-only modules). Browser-safe parts (import them
 * directly for the client): units.ts, correction.ts, compare.ts, curve.ts, errors.ts, warnings.ts. The Node-only
 * streaming reader `analyzeFile` lives in server/lib/run-files/; the command-line helpers in
 * server/cli/cli-support.ts.
 */
export { AnalysisError, type AnalysisErrorCode, isAnalysisError } from './errors.js';
export * from './units.js';
export { type Conditions } from './preamble.js';
export { type ColumnMapping, type MappingHelp, MAX_COLUMNS } from './columns.js';
export {
  type CorrectionStandard,
  CORRECTION_STANDARDS,
  REFERENCE_CONDITIONS,
  correctionFactor,
  dryAirPressureKpa,
  isCorrectionStandard,
} from './correction.js';
export { type NormalizedCurve, type Peaks, applyCorrection, peaksOf } from './curve.js';
export { type CompareOptions, type ComparisonFigures, type Repeatability, compareCurves, repeatability, integrate } from './compare.js';
export { savitzkyGolayCoefficients, smoothSavitzkyGolay } from './smoothing.js';
export { IDENTITY_TOLERANCE_PCT, identityStats } from './identity.js';
export {
  type AnalysisPulls,
  type AnalysisResult,
  type AnalyzeOptions,
  type GlitchReport,
  type PullInfo,
  DEFAULT_GRID_RPM,
  DEFAULT_MAX_BYTES,
  DEFAULT_SMOOTH,
  analyzeBuffer,
  analyzeBufferPulls,
} from './analyze.js';
export { type RpmPerSpeed, KMH_PER_MPH } from './columns.js';
export { ANALYSIS_WARNING_CODES, type AnalysisWarning, type AnalysisWarningCode, GLITCH_REVIEW_FRACTION } from './warnings.js';
