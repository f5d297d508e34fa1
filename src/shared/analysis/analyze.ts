/**
 * The ingest pipeline: bytes → decoded text → layout → columns → rows → sweep → cross-check →
 * resampled, smoothed curve → peaks and correction. `analyzeBuffer` works in memory; the
 * streaming `analyzeFile` (server/lib/run-files/analyze-file.ts) shares every step after reading.
 */
import { BLOCK_BYTES, BlockFeeder } from './blocks.js';
import { type ColumnMapping, type ColumnPlan, type RpmPerSpeed, recogniseColumns } from './columns.js';
import { type CorrectionStandard, isCorrectionStandard } from './correction.js';
import type { NormalizedCurve } from './curve.js';
import { assertLooksLikeText, detectEncoding } from './decode.js';
import { AnalysisError, toAnalysisError } from './errors.js';
import { type Layout, detectLayout } from './layout.js';
import { type Conditions, parsePreamble } from './preamble.js';
import { type AnalysisPulls, finishPulls } from './pulls.js';
import { MAX_LINE_CHARS, RowCollector, csvOptions } from './table.js';
import type { PowerUnit, TorqueUnit } from './units.js';
import type { AnalysisWarning } from './warnings.js';

export type { AnalysisPulls } from './pulls.js';

/** Options of {@link analyzeBuffer} and `analyzeFile`. */
export interface AnalyzeOptions {
  /** rpm step of the output grid (default 50). */
  gridRpm?: number;
  /** Savitzky–Golay window in grid points; 0 = off; default 5 (light). */
  smooth?: number;
  /** Correction standard applied to the reported peaks (default 'none'). */
  correction?: CorrectionStandard;
  /** Conditions overriding those read from the file's preamble. */
  conditions?: Partial<Conditions>;
  /** Column mapping overriding recognition. */
  mapping?: ColumnMapping;
  /** Largest accepted file, bytes (default 50 MB). */
  maxBytes?: number;
  /**
   * Engine speed per road/roller speed for the gear used, for logs without an engine-speed column:
   * engine rpm = speed × ratio (the speed column's mph or km/h is converted to the ratio's unit).
   */
  rpmPerSpeed?: RpmPerSpeed;
}

/** Where a pull lies in its log. */
export interface PullInfo {
  /** 0-based, in time order. */
  index: number;
  /** Pulls found in the log. */
  count: number;
  /** True for the pull with the largest rpm rise (what `analyzeBuffer`/`analyzeFile` return). */
  main: boolean;
  /** Aborted early: its rpm rise is well short of the main pull's (warning PULL_PARTIAL). */
  partial: boolean;
  /** 0-based indices of the pull's first and last data row (rows with numbers, in file order). */
  sampleRange: [number, number];
  /** File lines of the pull's first and last row (exact unless the table holds empty lines). */
  lineRange: [number, number];
  /** Values of the time column at those rows; null when the file has no time column. */
  timeRange: [number, number] | null;
}

/** Samples dropped as glitches (impossible engine-speed or load jumps) within a pull. */
export interface GlitchReport {
  /** Samples dropped between the pull's first and last row. */
  dropped: number;
  /** Samples dropped anywhere in the log. */
  droppedInLog: number;
  /** True when over 10 % of the pull's samples were glitches (warning GLITCHES_REVIEW). */
  review: boolean;
  /** Each contiguous range: data-row indices, file lines, the rpm read there, the rpm just before, and the time when known. */
  ranges: { rows: [number, number]; lines: [number, number]; rpmRead: [number, number]; rpmAround: number; time?: [number, number] }[];
}

/** Result of analysing one run file. */
export interface AnalysisResult {
  ok: true;
  /** Role → header text of the column used (rpm, torque, power, time, speed, manifoldPressure, intakeAirTemp, afr1…). */
  columns: Record<string, string | undefined>;
  /** Units the torque and power columns were read in (after any mix-up correction); null when absent. */
  units: { torque: TorqueUnit | null; power: PowerUnit | null };
  /** Raw data points in the main sweep. */
  points: number;
  /** Data points outside the main sweep, plus rows skipped for blank cells. */
  droppedPoints: number;
  /** rpm range of the resampled curve. */
  rpmRange: [number, number];
  /** Peak power, corrected with `correction.factor`. */
  peakPower: { hp: number; rpm: number };
  /** Peak torque, corrected with `correction.factor`. */
  peakTorque: { lbft: number; rpm: number };
  identity: { status: 'ok' | 'derived' | 'mismatch'; maxDeviationPct: number; medianDeviationPct: number };
  correction: { standard: CorrectionStandard; factor: number };
  conditions: Conditions;
  warnings: AnalysisWarning[];
  /** The resampled, smoothed sweep, UNCORRECTED. */
  curve: NormalizedCurve;
  headerSignature: string;
  /** 0..1 confidence of column recognition (1 with a mapping). */
  confidence: number;
  /** True when the run must be checked by hand before its figures are used (too many glitches). */
  review: boolean;
  /** Which pull of the log this is. */
  pull: PullInfo;
  /** Glitches dropped before the sweep was isolated. */
  glitches: GlitchReport;
}

/** Default largest file: 50 MB. */
export const DEFAULT_MAX_BYTES = 50 * 1024 * 1024;
/** Default rpm grid. */
export const DEFAULT_GRID_RPM = 50;
/** Default smoothing window (grid points). */
export const DEFAULT_SMOOTH = 5;
/** Fewest data points for a usable run. */
export const MIN_POINTS = 10;
/** Smallest rpm rise that counts as a sweep. */
export const MIN_SWEEP_RISE_RPM = 500;
/** Characters of the head used to sniff the layout. */
export const HEAD_CHARS = 256 * 1024;

/** Layout, column plan and preamble conditions: everything decided before the rows are read. */
export interface PreparedRead {
  layout: Layout;
  plan: ColumnPlan;
  preamble: Conditions;
}

/** Validates options (throws INVALID_OPTION) and fills defaults. */
export function normaliseOptions(options: AnalyzeOptions = {}): Required<Omit<AnalyzeOptions, 'mapping' | 'conditions' | 'rpmPerSpeed'>> & AnalyzeOptions {
  const gridRpm = options.gridRpm ?? DEFAULT_GRID_RPM;
  const smooth = options.smooth ?? DEFAULT_SMOOTH;
  const correction = options.correction ?? 'none';
  const maxBytes = options.maxBytes ?? DEFAULT_MAX_BYTES;
  if (!(Number.isFinite(gridRpm) && gridRpm >= 1 && gridRpm <= 1000)) throw new AnalysisError('INVALID_OPTION', 'The rpm grid must be between 1 and 1000 rpm.');
  if (!(Number.isInteger(smooth) && smooth >= 0 && smooth <= 101)) throw new AnalysisError('INVALID_OPTION', 'Smoothing must be a whole number of points from 0 to 101.');
  if (!isCorrectionStandard(correction)) throw new AnalysisError('INVALID_OPTION', `Unknown correction standard "${String(correction)}".`);
  if (!(maxBytes > 0)) throw new AnalysisError('INVALID_OPTION', 'The size limit must be positive.');
  return { ...options, gridRpm, smooth, correction, maxBytes };
}

/** Sniffs layout, reads the preamble and recognises columns from the head of the file. */
export function prepareRead(head: string, complete: boolean, options: AnalyzeOptions): PreparedRead {
  assertLooksLikeText(head);
  const layout = detectLayout(head, complete);
  const plan = recogniseColumns(layout.header, layout.unitsRow, layout.preview, layout.fieldCount, layout.decimalComma, options.mapping, options.rpmPerSpeed);
  const preamble = parsePreamble(layout.preamble, layout.delimiter, layout.decimalComma);
  return { layout, plan, preamble };
}

/** Reads a whole buffer: the main pull (largest rpm rise), as before multi-pull logs. Throws AnalysisError only. */
export function analyzeBuffer(bytes: Uint8Array, options: AnalyzeOptions = {}): AnalysisResult {
  const all = analyzeBufferPulls(bytes, options);
  return all.pulls[all.main];
}

/** Reads a whole buffer: every pull of the log, in time order. Throws AnalysisError only. */
export function analyzeBufferPulls(bytes: Uint8Array, options: AnalyzeOptions = {}): AnalysisPulls {
  try {
    const opts = normaliseOptions(options);
    if (bytes.length > opts.maxBytes) {
      throw new AnalysisError('FILE_TOO_LARGE', `The file is ${bytes.length} bytes; the limit is ${opts.maxBytes}.`);
    }
    const guess = detectEncoding(bytes);
    const text = new TextDecoder(guess.encoding, { fatal: false, ignoreBOM: true }).decode(bytes.subarray(guess.bomLength));
    const complete = text.length <= HEAD_CHARS;
    const head = complete ? text : text.slice(0, HEAD_CHARS);
    const prepared = prepareRead(head, complete, opts);
    // csv-parse reads UTF-8 bytes: pass UTF-8 input through untouched, transcode anything else.
    const data =
      guess.encoding === 'utf-8'
        ? bytes.subarray(guess.bomLength + utf8Length(head.slice(0, prepared.layout.dataStart)))
        : new TextEncoder().encode(text.slice(prepared.layout.dataStart));
    const collector = new RowCollector(prepared.plan, prepared.layout.decimalComma, estimateRows(head, prepared.layout.dataStart, data.length));
    const feeder = createFeeder(prepared, collector);
    for (let i = 0; i < data.length && !feeder.stopped; i += BLOCK_BYTES) feeder.push(data.subarray(i, i + BLOCK_BYTES));
    feeder.end();
    return finishPulls(collector, prepared, opts);
  } catch (e) {
    throw toAnalysisError(e);
  }
}

/** UTF-8 byte length of a string. */
export function utf8Length(s: string): number {
  return new TextEncoder().encode(s).length;
}

/** Rough row count of the data part, from the line density of the sniffed head (to pre-size arrays). */
export function estimateRows(head: string, dataStart: number, dataBytes: number): number {
  const sample = head.slice(dataStart, dataStart + 65_536);
  let lines = 0;
  for (let i = 0; i < sample.length; i++) if (sample.charCodeAt(i) === 10 || sample.charCodeAt(i) === 13) lines++;
  if (lines === 0 || sample.length === 0) return 1024;
  return Math.min(50_000_000, Math.ceil((dataBytes * lines) / utf8Length(sample)));
}

/** Block feeder wired to a collector: rejected records become errors with their file line. */
export function createFeeder(prepared: PreparedRead, collector: RowCollector): BlockFeeder {
  return new BlockFeeder(
    csvOptions(prepared.layout),
    (records) => collector.addAll(records),
    (line) => {
      if (collector.pendingError) return collector.pendingError(line);
      collector.tableEndLine = line;
      return null;
    },
    prepared.layout.dataStartLine,
    MAX_LINE_CHARS * 4,
  );
}

/** Turns collected rows into the main pull's result (see {@link finishPulls} for every pull). */
export function finishAnalysis(collector: RowCollector, prepared: PreparedRead, options: AnalyzeOptions): AnalysisResult {
  const all = finishPulls(collector, prepared, options);
  return all.pulls[all.main];
}
