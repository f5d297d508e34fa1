import { z } from 'zod';
import { optionalText, uuid } from './common';
import type { ComparisonFigures } from '@shared/analysis/compare';
import { CORRECTION_IDS, type CorrectionId } from './run';

/**
 * Contract of the comparisons API: preview, saved comparisons and the stage timeline. Shared by
 * the server's validation and the client's forms and types. Every figure the API returns is in
 * hp and lb·ft (the field names say so); `options.units` only tells screens, sentences and the
 * PDF how to display them.
 */

export const COMPARISON_UNITS = ['hp-lbft', 'kw-nm'] as const;
export type ComparisonUnits = (typeof COMPARISON_UNITS)[number];
/** 2..12 runs per comparison: enough for a build history, few enough to read on one chart. */
export const MIN_COMPARISON_RUNS = 2;
export const MAX_COMPARISON_RUNS = 12;
/**
 * Two runs "barely overlap" when their shared rpm range is less than this fraction of the
 * narrower run's range. Our own threshold: below half, most of one curve has nothing to be
 * compared against, and the area and average figures describe a small slice of the pull.
 */
export const MIN_OVERLAP_FRACTION = 0.5;
/** Ambient conditions further apart than these make a comparison unfair even after correction. */
export const MAX_TEMPERATURE_APART_C = 10;
export const MAX_PRESSURE_APART_KPA = 3;

const rpm = z.number({ invalid_type_error: 'rpm must be a number' }).min(0).max(30_000);

/** Options of a comparison. Omitted correction = each run's stored correction. */
export const comparisonOptions = z
  .object({
    /** Re-correct every run from its uncorrected curve and conditions with this standard. */
    correction: z.enum(CORRECTION_IDS).optional(),
    /** Extra Savitzky–Golay smoothing window in grid points (0 or 1 = as stored). */
    smooth: z.number().int().min(0).max(51).optional(),
    units: z.enum(COMPARISON_UNITS).optional(),
    rpmRange: z
      .tuple([rpm, rpm])
      .refine(([a, b]) => b > a, 'The upper rpm must be above the lower rpm')
      .optional(),
    bandWidthRpm: z.number().int().min(100, 'Bands of at least 100 rpm').max(5000, 'Bands of at most 5,000 rpm').optional(),
  })
  .strict();
export type ComparisonOptions = z.output<typeof comparisonOptions>;

const runIdList = z
  .array(uuid, { required_error: 'Choose the runs to compare' })
  .min(MIN_COMPARISON_RUNS, `Choose at least ${MIN_COMPARISON_RUNS} runs`)
  .max(MAX_COMPARISON_RUNS, `At most ${MAX_COMPARISON_RUNS} runs`)
  .refine((ids) => new Set(ids).size === ids.length, 'A run is listed twice');

const baseFields = {
  runIds: runIdList,
  baselineRunId: uuid,
  options: comparisonOptions.default({}),
};
const baselineAmongRuns = (v: { runIds: string[]; baselineRunId: string }) => v.runIds.includes(v.baselineRunId);
const baselineMessage = { message: 'The baseline must be one of the chosen runs', path: ['baselineRunId'] };

/** Body of POST /api/comparisons/preview. */
export const comparisonPreviewInput = z.object(baseFields).refine(baselineAmongRuns, baselineMessage);
export type ComparisonPreviewInput = z.output<typeof comparisonPreviewInput>;

/** Body of POST /api/comparisons (save). */
export const comparisonInput = z
  .object({
    ...baseFields,
    name: z.string({ required_error: 'Name is required' }).trim().min(1, 'Name is required').max(200, 'At most 200 characters'),
    note: optionalText(5000),
  })
  .refine(baselineAmongRuns, baselineMessage);
export type ComparisonInput = z.output<typeof comparisonInput>;

export const comparisonListQuery = z.object({ bikeId: uuid.optional() });
export const timelineQuery = z.object({
  bikeId: uuid,
  correction: z.enum(CORRECTION_IDS).optional(),
});

// ---- DTOs

export interface ComparisonWarning {
  code:
    | 'MIXED_CORRECTION'
    | 'CONDITIONS_MISSING'
    | 'DIFFERENT_DYNOS'
    | 'DYNO_UNKNOWN'
    | 'TEMPERATURE_APART'
    | 'PRESSURE_APART'
    | 'CROSS_CHECK_MISMATCH'
    | 'LITTLE_OVERLAP'
    | 'SEVERAL_BIKES'
    // From the run-file engine's warnings (src/shared/analysis/warnings.ts):
    | 'RUN_NEEDS_REVIEW'
    | 'GLITCHES_DROPPED'
    | 'PARTIAL_PULL'
    | 'RPM_FROM_SPEED';
  message: string;
  runIds?: string[];
}

/** One run as the comparison used it. */
export interface ComparisonRunSummary {
  runId: string;
  /** Display name (src/shared/labels.ts runName): the run's label, or "<stage> · pull <n>". */
  name: string;
  /** Secondary text: the run's file, and its pull of the file when it held several (runFileLabel). */
  fileName: string | null;
  /**
   * The run's colour slot (index into the run palette), from its place in its bike's archive, so a
   * run has the same colour in every comparison, the share page and the PDF
   * (server/modules/comparisons/run-colors.ts).
   */
  colorIndex: number;
  bikeId: string;
  bikeLabel: string;
  stageId: string | null;
  stageName: string | null;
  sessionId: string | null;
  dynoId: string | null;
  dynoName: string | null;
  recordedAt: string;
  identityStatus: string | null;
  conditions: { temperatureC: number | null; baroKpa: number | null; humidityPct: number | null };
  correction: {
    standard: CorrectionId;
    factor: number;
    /** stored: the upload's own factor; recomputed: the chosen standard; fallback: the chosen standard lacked conditions. */
    source: 'stored' | 'recomputed' | 'fallback';
  };
  rpmMin: number;
  rpmMax: number;
  /** Peaks of the corrected (and smoothed) curve, within the rpm range when one is set. */
  peakPower: { hp: number; rpm: number };
  peakTorque: { lbft: number; rpm: number };
}

/** The figures come from the analysis engine's own type, so the API and `compareCurves` cannot drift apart. */
type ComparisonBandFigures = ComparisonFigures['bands'][number];

export interface ComparisonBand extends ComparisonBandFigures {
  /** Run-to-run spread of this band where known (hp); null when no stage involved has 2+ runs. */
  spreadHp: number | null;
  withinRepeatability: boolean | null;
}

/** Figures of one run against the baseline (the `compare` command's fields, plus honesty marks). */
export interface ComparisonResult extends Omit<ComparisonFigures, 'bands'> {
  runId: string;
  bands: ComparisonBand[];
  /** The spread a gain has to beat; null flags mean "unknown" (no stage with 2+ runs). */
  spread: { peakPowerHp: number | null; peakTorqueLbft: number | null; averagePowerHp: number | null };
  withinRepeatability: { peakPower: boolean | null; peakTorque: boolean | null; averagePower: boolean | null };
  /** Plain sentences about this run. */
  sentences: string[];
}

export interface StageRepeatability {
  stageId: string;
  stageName: string;
  bikeId: string;
  runIds: string[];
  runs: number;
  peakPowerSpreadHp: number;
  peakTorqueSpreadLbft: number;
  /** Spread of the runs' average power over their common range (hp). */
  averagePowerSpreadHp: number;
  largestDeviationHp: number;
  largestDeviationRpm: number;
}

export interface ComparisonPreview {
  baseline: ComparisonRunSummary;
  /** Every run in the order given (baseline included), for legends and tables. */
  runs: ComparisonRunSummary[];
  /** One per non-baseline run, in the order given. */
  results: ComparisonResult[];
  /** Corrected curves on one shared rpm grid; null where a run has no data. hp and lb·ft. */
  curves: { rpm: number[]; runs: { runId: string; powerHp: (number | null)[]; torqueLbft: (number | null)[] }[] };
  warnings: ComparisonWarning[];
  /** Plain sentences for the whole comparison. */
  summary: string[];
  repeatability: StageRepeatability[];
  options: { correction: CorrectionId | null; smooth: number; units: ComparisonUnits; rpmRange: [number, number] | null; bandWidthRpm: number };
}

export interface ComparisonDto {
  id: string;
  name: string;
  bikeId: string;
  bikeLabel: string;
  runIds: string[];
  baselineRunId: string;
  options: ComparisonOptions;
  note: string | null;
  createdAt: string;
  createdByName: string | null;
}

/** GET /api/comparisons/:id: the saved comparison and its figures computed now. */
export interface ComparisonDetailDto {
  comparison: ComparisonDto;
  preview: ComparisonPreview | null;
  /** Why the preview could not be computed (e.g. a run was deleted since). */
  previewError: { code: string; message: string } | null;
}

export interface TimelineGain {
  peakPowerHp: number;
  peakPowerPct: number;
  peakTorqueLbft: number;
  averagePowerHp: number;
  areaPct: number;
  withinRepeatability: { peakPower: boolean | null; averagePower: boolean | null };
}

export interface TimelineStage {
  stageId: string;
  name: string;
  position: number;
  date: string | null;
  referenceRunId: string | null;
  reference: { peakPowerHp: number; peakPowerRpm: number; peakTorqueLbft: number; peakTorqueRpm: number; correction: CorrectionId } | null;
  parts: { id: string; category: string; description: string; partCostCents: number; labourCostCents: number }[];
  costCents: number;
  cumulativeCostCents: number;
  /** Against the nearest earlier stage with a reference run; null for the first. */
  vsPrevious: TimelineGain | null;
  /** Against the first stage with a reference run; null for that stage. */
  vsBaseline: TimelineGain | null;
  /** Cents per hp gained: this stage's cost ÷ gain vs previous (null when there is no positive gain). */
  costPerHp: { peakCents: number | null; averageCents: number | null } | null;
  /** All costs so far ÷ gain vs baseline. */
  cumulativeCostPerHp: { peakCents: number | null; averageCents: number | null } | null;
  repeatability: StageRepeatability | null;
}

export interface StageTimelineDto {
  bikeId: string;
  bikeLabel: string;
  correction: CorrectionId | null;
  stages: TimelineStage[];
  warnings: ComparisonWarning[];
}

export const candidatesQuery = z.object({ bikeId: uuid });

/** A run the builder may pick, with what it needs to show in the picker. */
export interface CandidateRunDto {
  id: string;
  name: string;
  /** The run's file (runFileLabel), secondary text under its name. */
  fileName: string;
  status: string;
  stageId: string | null;
  stageName: string | null;
  stagePosition: number | null;
  isReference: boolean;
  recordedAt: string;
  peakPowerHp: number | null;
  peakPowerRpm: number | null;
  peakTorqueLbft: number | null;
  rpmMin: number | null;
  rpmMax: number | null;
  correctionStandard: string | null;
  identityStatus: string | null;
}

/** GET /api/comparisons/candidates?bikeId=: a bike's runs and the suggested pair. */
export interface CandidatesDto {
  bikeId: string;
  bikeLabel: string;
  runs: CandidateRunDto[];
  /** Reference run of the previous stage (baseline) against that of the latest stage; else the two newest ready runs. */
  suggestion: { baselineRunId: string; runIds: string[] } | null;
}
