import { z } from 'zod';
import type { ApiErrorCode } from '../errors';
import { listQuery, optionalNumber, optionalText, queryBoolean, uuid } from './common';
import { HEAD_WORK_LEVELS, PART_CATEGORIES, type HeadWorkLevel, type PartCategory } from '../parts';

/**
 * Contract of the run archive API (sessions, stages, parts, runs, dynos). Shared by the server's
 * validation and the client's forms and types.
 */
export const CORRECTION_IDS = ['none', 'sae-j1349', 'sae-j1349-1990', 'iso-1585', 'din-70020', 'sae-j607'] as const;
export type CorrectionId = (typeof CORRECTION_IDS)[number];
export const RUN_STATUSES = ['ready', 'needs-mapping', 'failed'] as const;
export type RunStatusId = (typeof RUN_STATUSES)[number];

// ---- dynos
export const dynoInput = z.object({
  name: z.string().trim().min(1, 'Name is required').max(100),
  kind: z.enum(['inertia', 'eddy-current', 'other']),
  notes: optionalText(2000),
});
export interface DynoDto {
  id: string;
  name: string;
  kind: 'inertia' | 'eddy-current' | 'other';
  notes: string | null;
}

// ---- sessions
export const sessionInput = z.object({
  bikeId: uuid,
  startedAt: z.coerce.date().optional(),
  dynoId: uuid.nullish(),
  ambientTempC: optionalNumber({ label: 'Ambient temperature', min: -40, max: 60 }),
  baroKpa: optionalNumber({ label: 'Barometric pressure', min: 60, max: 110 }),
  humidityPct: optionalNumber({ label: 'Relative humidity', min: 0, max: 100 }),
  correctionStandard: z.enum(CORRECTION_IDS).default('sae-j1349'),
  notes: optionalText(5000),
});
export const sessionUpdateInput = sessionInput.omit({ bikeId: true }).partial();
/** The dyno-bay checks confirmed before the first pull of a session. */
export const SAFETY_CHECKS = [
  { id: 'restraints', label: 'Bike strapped down, wheel chocked, restraints checked' },
  { id: 'cooling', label: 'Cooling fan running' },
  { id: 'extraction', label: 'Exhaust extraction on' },
  { id: 'hearing', label: 'Hearing protection on for everyone in the bay' },
  { id: 'clear', label: 'Nobody in line with the roller or the rear wheel' },
  { id: 'extinguisher', label: 'Fire extinguisher at hand' },
] as const;
export const safetyCheckInput = z.object({
  checks: z.array(z.enum(SAFETY_CHECKS.map((c) => c.id) as [string, ...string[]])).refine((c) => SAFETY_CHECKS.every((s) => c.includes(s.id)), 'Confirm every check before the first pull'),
});
export interface SessionDto {
  id: string;
  bikeId: string;
  startedAt: string;
  dynoId: string | null;
  dynoName: string | null;
  operatorName: string | null;
  ambientTempC: number | null;
  baroKpa: number | null;
  humidityPct: number | null;
  correctionStandard: CorrectionId;
  notes: string | null;
  safetyConfirmedAt: string | null;
  safetyConfirmedByName: string | null;
  runCount: number;
  /** Started from the bay with the shop's default conditions, not yet entered by hand. */
  conditionsToConfirm?: boolean;
}
/** GET /api/sessions/:id: a session with its runs in order. */
export interface SessionDetailDto extends SessionDto {
  runs: RunSummaryDto[];
}

// ---- stages and parts
export const partInput = z.object({
  category: z.enum(PART_CATEGORIES),
  description: z.string().trim().min(1, 'Describe the part or job').max(500),
  partCost: optionalNumber({ label: 'Part cost', min: 0, max: 1_000_000 }),
  labourCost: optionalNumber({ label: 'Labour cost', min: 0, max: 1_000_000 }),
  headWorkLevel: z.enum(HEAD_WORK_LEVELS).nullish(),
});
export const stageInput = z.object({
  bikeId: uuid,
  name: z.string().trim().min(1, 'Name is required').max(120),
  date: z.string().date().nullish(),
  description: optionalText(5000),
  parts: z.array(partInput).max(100).default([]),
});
export const stageUpdateInput = stageInput.omit({ bikeId: true }).partial();
export interface PartDto {
  id: string;
  category: PartCategory;
  description: string;
  /** Money in cents. */
  partCostCents: number;
  labourCostCents: number;
  headWorkLevel: HeadWorkLevel | null;
}
export interface StageDto {
  id: string;
  bikeId: string;
  position: number;
  name: string;
  date: string | null;
  description: string | null;
  parts: PartDto[];
  totalCostCents: number;
  referenceRunId: string | null;
  runCount: number;
  /** Gains of the reference run against the bike's baseline stage (null for the baseline). */
  gainPeakPowerHp: number | null;
  gainAreaPct: number | null;
  gainAveragePowerHp: number | null;
}

// ---- runs
export const runUpdateInput = z.object({
  stageId: uuid.nullish(),
  label: optionalText(200),
  tags: z.array(z.string().trim().min(1).max(40)).max(30).optional(),
  note: optionalText(5000),
});
const unitColumn = <U extends string>(units: readonly [U, ...U[]]) => z.object({ column: z.string().min(1), unit: z.enum(units) });
export const columnMappingInput = z.object({
  rpm: z.string().min(1, 'Choose the engine-speed column'),
  torque: unitColumn(['lbft', 'nm', 'kgfm'] as const).optional(),
  power: unitColumn(['hp', 'kw', 'ps'] as const).optional(),
}).refine((m) => m.torque || m.power, 'Map a torque or a power column (or both)');
/** Engine speed per road/roller speed for the gear used (rpm per mph or per km/h), for logs without an engine-speed column. */
export const rpmPerSpeedInput = z.object({
  ratio: z.number({ message: 'Give the engine-speed ratio' }).positive('The ratio must be above zero').max(1000, 'At most 1000 rpm per unit of road speed'),
  unit: z.enum(['mph', 'km/h']),
});
export type RpmPerSpeedDto = z.output<typeof rpmPerSpeedInput>;
export const applyMappingInput = z.object({
  /** Columns by hand; may be left out when an engine-speed ratio is given and the rest is recognised. */
  mapping: columnMappingInput.optional(),
  /** For a log without an engine-speed column: compute engine speed from its road/roller speed column. */
  rpmPerSpeed: rpmPerSpeedInput.optional(),
  /** Save as a named column layout, reused when the same header appears again. */
  saveLayoutName: z.string().trim().min(1).max(120).optional(),
}).refine((m) => m.mapping || m.rpmPerSpeed, 'Map the columns or give the engine-speed ratio');
export const RUN_SORTS = ['createdAt', 'peakPowerHp', 'peakTorqueLbft'] as const;
export const runListQuery = listQuery(RUN_SORTS).extend({
  bikeId: uuid.optional(),
  customerId: uuid.optional(),
  stageId: uuid.optional(),
  sessionId: uuid.optional(),
  tag: z.string().trim().max(40).optional(),
  status: z.enum(RUN_STATUSES).optional(),
  from: z.string().date().optional(),
  to: z.string().date().optional(),
  includeDeleted: queryBoolean.optional(),
  /** The previous page's `nextCursor`: keyset paging (then `page` is ignored). */
  cursor: z.string().max(500).optional(),
});
export interface RunWarning {
  code: string;
  message: string;
}
export interface RunSummaryDto {
  id: string;
  bikeId: string;
  bikeLabel: string;
  customerName: string;
  sessionId: string | null;
  stageId: string | null;
  stageName: string | null;
  label: string | null;
  sequence: number;
  originalName: string;
  status: RunStatusId;
  peakPowerHp: number | null;
  peakPowerRpm: number | null;
  peakTorqueLbft: number | null;
  peakTorqueRpm: number | null;
  rpmMin: number | null;
  rpmMax: number | null;
  identityStatus: 'ok' | 'derived' | 'mismatch' | null;
  correctionStandard: CorrectionId | null;
  correctionFactor: number | null;
  warnings: RunWarning[];
  error: { code: ApiErrorCode; message: string } | null;
  tags: string[];
  note: string | null;
  isReference: boolean;
  /** Which pull of its raw file this run is (0-based) and how many pulls the file holds. */
  pullIndex: number;
  pullCount: number;
  /** Marked for a check by hand before its figures are used (warning GLITCHES_REVIEW). */
  review: boolean;
  createdAt: string;
  deletedAt: string | null;
}
export interface RunDetailDto extends RunSummaryDto {
  /** Uncorrected curve on the regular rpm grid; apply correctionFactor (or another standard) for display. */
  curve: { rpm: number[]; torqueLbft: number[]; powerHp: number[]; afr: Record<string, number[]> } | null;
  conditions: { temperatureC?: number; baroKpa?: number; humidityPct?: number; [k: string]: unknown } | null;
  columns: Record<string, unknown> | null;
  mapping: Record<string, unknown> | null;
  rawSizeBytes: number;
  rawSha256: string;
  /** Where this run's pull lies in the log: time-column values and 0-based data rows (null when unknown). */
  pullTimeS: [number, number] | null;
  pullRows: [number, number] | null;
  /** The engine-speed ratio used for a log without an engine-speed column. */
  rpmPerSpeed: RpmPerSpeedDto | null;
  uploadedByName: string | null;
  dynoName: string | null;
  /** Present when status is needs-mapping: headers, preview rows and suggestions. */
  mappingHelp: {
    headers: string[];
    previewRows: string[][];
    suggestions: Record<string, unknown>;
    /** NO_RPM_COLUMN with a road/roller speed column: its header, and how to give an engine-speed ratio. */
    speedColumn?: string;
    rpmPerSpeedHint?: string;
  } | null;
}
/**
 * Why a file could not be read or saved; the run (when one was kept) still lists it. The server
 * answers an ApiErrorCode; the upload screen also files its own transport failures (a cancelled
 * or broken upload) under codes of its own, hence the wider type.
 */
export interface RunFileError {
  code: ApiErrorCode | (string & {});
  message: string;
  details?: unknown;
}
/**
 * What one uploaded file became. A log may hold several pulls: `pullCount` tells how many were
 * found and `runs` lists every run of the file (one per pull, in time order; each with its own
 * status, warnings and error). `run` is the file's first readable run; a file none of whose
 * pulls could be read answers ok: false with the first run's error.
 */
export type UploadResult =
  | { file: string; ok: true; duplicate?: boolean; message?: string; run: RunSummaryDto; pullCount?: number; runs?: RunSummaryDto[] }
  | { file: string; ok: false; error: RunFileError; runId?: string; pullCount?: number; runs?: RunSummaryDto[] };
export interface UploadResponse {
  results: UploadResult[];
}
/** One field a re-processing changed (figures rounded as shown; warnings and error by code). */
export interface RunChangeDto {
  field: string;
  before: unknown;
  after: unknown;
}
/** A re-processed run and what changed. */
export interface RunReprocessDto extends RunDetailDto {
  changes: RunChangeDto[];
}
/** The first rows of a run's raw file, for the mapping dialog. */
export interface RunPreviewDto {
  runId: string;
  originalName: string;
  status: RunStatusId;
  headers: string[];
  previewRows: string[][];
  suggestions: Record<string, unknown>;
  headerSignature: string | null;
  /** Roles the mapping must name (rpm, torque or power) when known. */
  needs: string[];
  /** The mapping last used, if any. */
  mapping: Record<string, unknown> | null;
}
/** A column mapping the shop saved for a file layout. */
export interface ColumnLayoutDto {
  id: string;
  name: string;
  headerSignature: string;
  mapping: Record<string, unknown>;
  createdAt: string;
}

/** POST /api/runs/stage: set (or clear) the stage of several runs of one bike in one go. */
export const runsStageInput = z.object({
  runIds: z.array(uuid).min(1, 'Choose at least one run').max(200, 'At most 200 runs at once'),
  stageId: uuid.nullable(),
});
export interface RunsStageDto {
  /** How many runs changed stage (runs already on it are left as they are). */
  updated: number;
}
