/**
 * Plain data the comparison engine works on: a run as read for a comparison (no ORM entity, no
 * database handle) and a run once prepared (corrected, smoothed, summarised).
 */
import type { NormalizedCurve } from '@shared/analysis/curve';
import type { ComparisonRunSummary, ComparisonWarning } from '@shared/schemas/comparison';

/** Default width of the rpm bands gains are reported in. */
export const DEFAULT_BAND_WIDTH = 1000;
/** Runs of one stage considered for its run-to-run spread (newest first). */
export const MAX_STAGE_RUNS = 12;

/** A run's stored (uncorrected) curve: rpm, lb·ft and hp at the same samples. */
export interface EngineCurve {
  rpm: number[];
  torqueLbft: number[];
  powerHp: number[];
  afr?: Record<string, number[]>;
}

/** One run as a comparison reads it (server/modules/comparisons/comparison-runs.ts fills it). */
export interface EngineRun {
  id: string;
  label: string | null;
  sequence: number;
  status: string;
  /** Null when the run has none, and for archive rows whose curve the caller did not ask for. */
  curve: EngineCurve | null;
  correctionStandard: string | null;
  correctionFactor: number | null;
  conditions: Record<string, unknown> | null;
  identityStatus: string | null;
  /** The run-file engine's warnings on the run (codes from src/shared/analysis/warnings.ts); absent = none known. */
  warnings?: { code: string; message?: string }[];
  createdAt: Date;
  bike: { id: string; make: string; model: string; year: number | null };
  /** The uploaded file the run came from (secondary text of its name); absent when the caller did not read it. */
  file?: { originalName: string; pullIndex: number; pullCount: number } | null;
  stage: { id: string; name: string; position: number } | null;
  session: { id: string; startedAt: Date; ambientTempC: number | null; baroKpa: number | null; humidityPct: number | null; dyno: { id: string; name: string } | null } | null;
}

/** A run corrected (and smoothed) for one comparison, with its summary and its own warnings. */
export interface Prepared {
  run: EngineRun;
  curve: NormalizedCurve;
  summary: ComparisonRunSummary;
  warnings: ComparisonWarning[];
}
