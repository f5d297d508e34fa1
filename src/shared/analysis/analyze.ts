/**
 * The ingest pipeline: bytes → decoded text → layout → columns → rows → sweep → cross-check →
 * resampled, smoothed curve → peaks and correction. `analyzeBuffer` works in memory; the
 * streaming `analyzeFile` (server/lib/run-files/analyze-file.ts) shares every step after reading.
 */
import { BLOCK_BYTES, BlockFeeder } from './blocks.js';
import { type ColumnMapping, type ColumnPlan, recogniseColumns } from './columns.js';
import { type CorrectionStandard, correctionFactor, isCorrectionStandard } from './correction.js';
import { type NormalizedCurve, peaksOf } from './curve.js';
import { assertLooksLikeText, detectEncoding } from './decode.js';
import { AnalysisError, toAnalysisError } from './errors.js';
import { IDENTITY_TOLERANCE_PCT, diagnoseMismatch, identityStats } from './identity.js';
import { type Layout, detectLayout } from './layout.js';
import { type Conditions, parsePreamble } from './preamble.js';
import { resampleToGrid } from './resample.js';
import { smoothSavitzkyGolay } from './smoothing.js';
import { findSweep, trimThrottleEdges } from './sweep.js';
import { MAX_LINE_CHARS, RowCollector, csvOptions } from './table.js';
import {
  GASOLINE_STOICH_AFR,
  HP_TORQUE_CONSTANT,
  type PowerUnit,
  type TorqueUnit,
  powerToHp,
  torqueToLbft,
} from './units.js';

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
  warnings: { code: string; message: string }[];
  /** The resampled, smoothed sweep, UNCORRECTED. */
  curve: NormalizedCurve;
  headerSignature: string;
  /** 0..1 confidence of column recognition (1 with a mapping). */
  confidence: number;
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
export function normaliseOptions(options: AnalyzeOptions = {}): Required<Omit<AnalyzeOptions, 'mapping' | 'conditions'>> & AnalyzeOptions {
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
  const plan = recogniseColumns(layout.header, layout.unitsRow, layout.preview, layout.fieldCount, layout.decimalComma, options.mapping);
  const preamble = parsePreamble(layout.preamble, layout.delimiter, layout.decimalComma);
  return { layout, plan, preamble };
}

/** Reads a whole buffer. Throws AnalysisError only. */
export function analyzeBuffer(bytes: Uint8Array, options: AnalyzeOptions = {}): AnalysisResult {
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
    for (let i = 0; i < data.length; i += BLOCK_BYTES) feeder.push(data.subarray(i, i + BLOCK_BYTES));
    feeder.end();
    return finishAnalysis(collector, prepared, opts);
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
    (line) => (collector.pendingError as (line: number) => AnalysisError)(line),
    prepared.layout.dataStartLine,
    MAX_LINE_CHARS * 4,
  );
}

function scaleInPlace(values: Float32Array | Float64Array, factor: number): void {
  for (let i = 0; i < values.length; i++) values[i] *= factor;
}

/** Turns collected rows into the result: sweep, cross-check, resampling, smoothing, peaks, correction. */
export function finishAnalysis(collector: RowCollector, prepared: PreparedRead, options: AnalyzeOptions): AnalysisResult {
  const opts = normaliseOptions(options);
  const { plan, layout } = prepared;
  const warnings = [...plan.warnings];
  const n = collector.rpm.length;
  if (n === 0) {
    throw new AnalysisError('TOO_FEW_POINTS', 'The file has no usable data rows.', { line: layout.dataStartLine });
  }
  if (n < MIN_POINTS) throw new AnalysisError('TOO_FEW_POINTS', `The file has only ${n} data points; at least ${MIN_POINTS} are needed.`);
  const rpmAll = collector.rpm.view();
  const sweep = findSweep(rpmAll, n);
  if (!sweep || sweep.riseRpm < MIN_SWEEP_RISE_RPM) {
    throw new AnalysisError('NO_SWEEP', `Engine speed never rises by ${MIN_SWEEP_RISE_RPM} rpm or more; the file holds no sweep.`, {
      column: plan.cells[plan.rpm].original,
    });
  }
  // Drop part-throttle points at the sweep's edges (end of the lead-in, the throttle-off moment).
  const rawLoad = plan.torque ? collector.torque.view() : collector.power.view();
  const edges = trimThrottleEdges(rawLoad.subarray(sweep.start, sweep.end + 1));
  sweep.end = sweep.start + edges.to - 1;
  sweep.start += edges.from;
  const count = sweep.end - sweep.start + 1;
  if (count < MIN_POINTS) throw new AnalysisError('TOO_FEW_POINTS', `The sweep has only ${count} data points; at least ${MIN_POINTS} are needed.`);

  const rpm = rpmAll.slice(sweep.start, sweep.end + 1);
  let torqueUnit: TorqueUnit | null = plan.torque?.unit ?? null;
  let powerUnit: PowerUnit | null = plan.power?.unit ?? null;
  const rawT = collector.torque.view().subarray(sweep.start, sweep.end + 1);
  const rawP = collector.power.view().subarray(sweep.start, sweep.end + 1);
  const torque = new Float64Array(count);
  const power = new Float64Array(count);
  let identity: AnalysisResult['identity'];
  if (torqueUnit && powerUnit) {
    for (let i = 0; i < count; i++) {
      torque[i] = torqueToLbft(rawT[i], torqueUnit);
      power[i] = powerToHp(rawP[i], powerUnit);
    }
    const stats = identityStats(rpm, torque, power);
    identity = { status: stats.medianDeviationPct <= IDENTITY_TOLERANCE_PCT ? 'ok' : 'mismatch', ...stats };
    if (identity.status === 'mismatch') {
      const d = diagnoseMismatch(rpm, torque, power, { torque: torqueUnit, power: powerUnit });
      const before = `power differs from torque × rpm / 5252 by ${stats.medianDeviationPct.toFixed(1)} % (median)`;
      if (d.units) {
        const sT = torqueToLbft(1, d.units.torque) / torqueToLbft(1, torqueUnit);
        const sP = powerToHp(1, d.units.power) / powerToHp(1, powerUnit);
        scaleInPlace(torque, sT);
        scaleInPlace(power, sP);
        const changed = [
          d.units.torque !== torqueUnit ? `torque is in ${d.units.torque}, not ${torqueUnit}` : '',
          d.units.power !== powerUnit ? `power is in ${d.units.power}, not ${powerUnit}` : '',
        ].filter(Boolean);
        warnings.push({ code: 'UNIT_CORRECTED', message: `As labelled, ${before}; the data fit only if ${changed.join(' and ')}, so that was applied.` });
        torqueUnit = d.units.torque;
        powerUnit = d.units.power;
        const after = identityStats(rpm, torque, power);
        identity = { status: 'ok', ...after };
      } else if (d.fits.length > 1) {
        warnings.push({
          code: 'IDENTITY_MISMATCH',
          message: `As labelled, ${before}; several unit mix-ups would explain it (${d.fits.map((f) => `${f.torque}/${f.power}`).join(', ')}), so nothing was changed. Map the units by hand.`,
        });
      } else if (d.rpmFactor !== undefined) {
        warnings.push({
          code: 'RPM_NOT_ENGINE_SPEED',
          message: `As labelled, ${before}, by a constant factor of ${d.rpmFactor.toFixed(3)}: the speed column "${plan.cells[plan.rpm].original}" looks proportional to, but not, engine rpm. Figures are not corrected; map the engine-speed column.`,
        });
      } else {
        warnings.push({ code: 'IDENTITY_MISMATCH', message: `As labelled, ${before}, and no unit mix-up explains it. Check the file before using its figures.` });
      }
    } else {
      // Within tolerance, but hp vs PS (1.4 % apart) can hide inside it: say so when PS fits much better.
      const d = diagnoseMismatch(rpm, torque, power, { torque: torqueUnit, power: powerUnit });
      const best = d.fits[0];
      if (best && best.medianDeviationPct < 0.3 * stats.medianDeviationPct && stats.medianDeviationPct > 0.5) {
        warnings.push({
          code: 'UNIT_SUSPECT',
          message: `Power and torque agree within tolerance, but they agree better if torque is in ${best.torque} and power in ${best.power}; check the units.`,
        });
      }
    }
  } else if (torqueUnit) {
    for (let i = 0; i < count; i++) {
      torque[i] = torqueToLbft(rawT[i], torqueUnit);
      power[i] = (torque[i] * rpm[i]) / HP_TORQUE_CONSTANT;
    }
    identity = { status: 'derived', maxDeviationPct: 0, medianDeviationPct: 0 };
  } else {
    for (let i = 0; i < count; i++) {
      power[i] = powerToHp(rawP[i], powerUnit as PowerUnit);
      torque[i] = rpm[i] > 0 ? (power[i] * HP_TORQUE_CONSTANT) / rpm[i] : NaN;
    }
    identity = { status: 'derived', maxDeviationPct: 0, medianDeviationPct: 0 };
  }

  const afrSeries = collector.afr.map((s, k) => {
    const v = s.view().slice(sweep.start, sweep.end + 1);
    if (plan.afr[k].lambda) scaleInPlace(v, GASOLINE_STOICH_AFR);
    return v;
  });
  const { grid, values } = resampleToGrid(rpm, [torque, power, ...afrSeries], opts.gridRpm);
  if (grid.length < 5) throw new AnalysisError('TOO_FEW_POINTS', 'The sweep covers too narrow an rpm range for the grid.');
  const smooth = (v: number[]) => (opts.smooth > 0 ? smoothSavitzkyGolay(v, opts.smooth) : v);
  const afr: Record<string, number[]> = {};
  plan.afr.forEach((a, k) => {
    const name = plan.cells[a.index].original + (a.lambda ? ' (AFR)' : '');
    afr[name] = smooth(values[2 + k]);
  });
  const curve: NormalizedCurve = { rpm: grid, torqueLbft: smooth(values[0]), powerHp: smooth(values[1]), afr };

  const conditions: Conditions = { ...prepared.preamble, ...stripUndefined(opts.conditions ?? {}) };
  const factor = correctionFactor(opts.correction, conditions);
  if (opts.correction !== 'none' && opts.correction !== 'din-70020' && typeof conditions.humidityPct !== 'number') {
    warnings.push({ code: 'HUMIDITY_ASSUMED_DRY', message: 'No relative humidity was given; dry air (0 %) was assumed for the correction.' });
  }
  const peaks = peaksOf(curve);

  const columns: Record<string, string | undefined> = {
    rpm: plan.cells[plan.rpm].original,
    torque: plan.torque ? plan.cells[plan.torque.index].original : undefined,
    power: plan.power ? plan.cells[plan.power.index].original : undefined,
    time: plan.time !== null ? plan.cells[plan.time].original : undefined,
    speed: plan.speed ? plan.cells[plan.speed.index].original : undefined,
    manifoldPressure: plan.manifoldPressure !== null ? plan.cells[plan.manifoldPressure].original : undefined,
    intakeAirTemp: plan.intakeAirTemp !== null ? plan.cells[plan.intakeAirTemp].original : undefined,
  };
  plan.afr.forEach((a, k) => (columns[`afr${k + 1}`] = plan.cells[a.index].original));
  if (collector.blankRows > 0) {
    warnings.push({ code: 'ROWS_SKIPPED', message: `${collector.blankRows} row(s) with blank cells were skipped.` });
  }

  return {
    ok: true,
    columns,
    units: { torque: torqueUnit, power: powerUnit },
    points: count,
    droppedPoints: n - count + collector.blankRows,
    rpmRange: [grid[0], grid[grid.length - 1]],
    peakPower: { hp: peaks.peakPower.hp * factor, rpm: peaks.peakPower.rpm },
    peakTorque: { lbft: peaks.peakTorque.lbft * factor, rpm: peaks.peakTorque.rpm },
    identity,
    correction: { standard: opts.correction, factor },
    conditions,
    warnings,
    curve,
    headerSignature: plan.signature,
    confidence: plan.confidence,
  };
}

function stripUndefined<T extends object>(o: T): Partial<T> {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as Partial<T>;
}
