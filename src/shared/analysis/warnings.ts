/**
 * Warnings of the ingest engine. Every heuristic that changes or drops data says so with a stable
 * `code` (part of the API: the run page, comparison fairness warnings and the PDF switch on it)
 * and a plain-English `message`; some carry structured `details`. Browser-safe.
 */

/** Stable warning codes. Add new ones at the end; never rename. */
export const ANALYSIS_WARNING_CODES = [
  'COLUMNS_GUESSED',
  'RPM_COLUMN_GUESSED',
  'UNIT_ASSUMED',
  'UNIT_CORRECTED',
  'UNIT_SUSPECT',
  'IDENTITY_MISMATCH',
  'RPM_NOT_ENGINE_SPEED',
  'HUMIDITY_ASSUMED_DRY',
  'ROWS_SKIPPED',
  /** Added by the runs module when a correction was asked for but conditions are missing. */
  'UNCORRECTED',
  /** Samples with physically impossible engine-speed (or load) jumps were dropped. */
  'GLITCHES_DROPPED',
  /** More than {@link GLITCH_REVIEW_FRACTION} of a pull's samples were glitches: check the run by hand. */
  'GLITCHES_REVIEW',
  /** The log holds several pulls; this result is one of them. */
  'PULLS_FOUND',
  /** This pull was aborted early (its rpm rise is well short of the log's longest pull). */
  'PULL_PARTIAL',
  /** A non-numeric row after the data ended the table; the rest of the file was not read. */
  'TABLE_ENDED_EARLY',
  /** Engine speed was logged in thousands (x1000, krpm) and was scaled to rpm. */
  'RPM_SCALED',
  /** Engine speed was computed from a road/roller speed column with a given ratio. */
  'RPM_FROM_SPEED',
  /** Samples where the engine slowed or the load was negative were cut from the sweep's edges. */
  'DECEL_EXCLUDED',
] as const;

/** A stable warning code, see {@link ANALYSIS_WARNING_CODES}. */
export type AnalysisWarningCode = (typeof ANALYSIS_WARNING_CODES)[number];

/** One warning of an analysis. */
export interface AnalysisWarning {
  code: AnalysisWarningCode;
  message: string;
  /** Structured data for the UI (e.g. the ranges of dropped samples); optional. */
  details?: unknown;
}

/** Share of a pull's samples above which glitches mark the run for review (10 %). */
export const GLITCH_REVIEW_FRACTION = 0.1;
