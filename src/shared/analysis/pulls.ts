/**
 * From collected rows to results: glitch rejection, every pull of the log (sweep isolation with
 * coast-downs and negative load excluded), cross-check, resampling, smoothing, peaks, correction.
 * Shared by `analyzeBuffer`/`analyzeBufferPulls` and the streaming reader.
 */
import type { AnalysisResult, AnalyzeOptions, GlitchReport, PreparedRead, PullInfo } from './analyze.js';
import { MIN_POINTS, MIN_SWEEP_RISE_RPM, normaliseOptions } from './analyze.js';
import { correctionFactor } from './correction.js';
import { type NormalizedCurve, peaksOf } from './curve.js';
import { AnalysisError } from './errors.js';
import { findGlitches, glitchRanges } from './glitches.js';
import { IDENTITY_TOLERANCE_PCT, diagnoseMismatch, identityStats } from './identity.js';
import type { Conditions } from './preamble.js';
import { resampleToGrid } from './resample.js';
import { smoothSavitzkyGolay } from './smoothing.js';
import { type SweepRange, findSweeps, trimThrottleEdges } from './sweep.js';
import type { RowCollector } from './table.js';
import { GASOLINE_STOICH_AFR, HP_TORQUE_CONSTANT, type PowerUnit, type TorqueUnit, powerToHp, torqueToLbft } from './units.js';
import { type AnalysisWarning, GLITCH_REVIEW_FRACTION } from './warnings.js';

/** A pull spanning less than this share of the main pull's full-throttle rpm span is partial (aborted early). */
export const PARTIAL_RISE_FRACTION = 0.6;
/** Leading samples of a sweep under this share of the load of its second half are a part-throttle roll-on. */
export const PART_THROTTLE_FRACTION = 0.5;
/** Dropped-sample ranges listed in a warning message (all are in `glitches.ranges`). */
const RANGES_IN_MESSAGE = 5;

/** All pulls of a log, in time order. */
export interface AnalysisPulls {
  pulls: AnalysisResult[];
  /** Index in `pulls` of the main pull (the largest rpm rise): what `analyzeBuffer` returns. */
  main: number;
}

/** The collected channels after glitch rejection (`orig[i]` = collected row of clean sample i). */
interface CleanSeries {
  rpm: Float32Array;
  torque: Float32Array;
  power: Float32Array;
  afr: Float32Array[];
  time: Float32Array | null;
  orig: Uint32Array | null;
  marks: Uint8Array;
  glitchCount: number;
}

function compact(v: Float32Array, keep: Uint32Array): Float32Array {
  const out = new Float32Array(keep.length);
  for (let i = 0; i < keep.length; i++) out[i] = v[keep[i]];
  return out;
}

function gather(v: Float32Array, idx: Int32Array): Float64Array {
  const out = new Float64Array(idx.length);
  for (let i = 0; i < idx.length; i++) out[i] = v[idx[i]];
  return out;
}

function cleanSeries(collector: RowCollector, prepared: PreparedRead): CleanSeries {
  const { plan } = prepared;
  const rpm = collector.rpm.view();
  const torque = collector.torque.view();
  const power = collector.power.view();
  const afr = collector.afr.map((a) => a.view());
  const time = plan.time !== null ? collector.time.view() : null;
  const { marks, count } = findGlitches(rpm, plan.torque ? torque : power);
  if (count === 0) return { rpm, torque, power, afr, time, orig: null, marks, glitchCount: 0 };
  const keep = new Uint32Array(rpm.length - count);
  for (let i = 0, k = 0; i < rpm.length; i++) if (!marks[i]) keep[k++] = i;
  return {
    rpm: compact(rpm, keep),
    torque: plan.torque ? compact(torque, keep) : torque,
    power: plan.power ? compact(power, keep) : power,
    afr: afr.map((a) => compact(a, keep)),
    time: time ? compact(time, keep) : null,
    orig: keep,
    marks,
    glitchCount: count,
  };
}

/** Time values are kept as 32-bit floats: round to the millisecond for reporting. */
const roundTime = (v: number) => Math.round(v * 1000) / 1000;
const fmt = (v: number) => Math.round(v).toLocaleString('en-US');

/** Turns collected rows into one result per pull. Throws NO_SWEEP / TOO_FEW_POINTS when there is no usable pull. */
export function finishPulls(collector: RowCollector, prepared: PreparedRead, options: AnalyzeOptions): AnalysisPulls {
  const opts = normaliseOptions(options);
  const { plan, layout } = prepared;
  const n = collector.rpm.length;
  if (n === 0) {
    throw new AnalysisError('TOO_FEW_POINTS', 'The file has no usable data rows.', { line: layout.dataStartLine });
  }
  if (n < MIN_POINTS) throw new AnalysisError('TOO_FEW_POINTS', `The file has only ${n} data points; at least ${MIN_POINTS} are needed.`);
  const s = cleanSeries(collector, prepared);
  const sweeps = findSweeps(s.rpm, MIN_SWEEP_RISE_RPM);
  if (sweeps.length === 0) {
    throw new AnalysisError('NO_SWEEP', `Engine speed never rises by ${MIN_SWEEP_RISE_RPM} rpm or more; the file holds no sweep.`, {
      column: plan.cells[plan.rpm].original,
    });
  }
  let mainAt = 0;
  sweeps.forEach((w, i) => {
    if (w.riseRpm > sweeps[mainAt].riseRpm) mainAt = i;
  });
  const picks = sweeps.map((w) => pickSweep(s, w, plan.torque !== null));
  const spanOf = (idx: Int32Array) => {
    let lo = Infinity;
    let hi = -Infinity;
    for (let i = 0; i < idx.length; i++) {
      lo = Math.min(lo, s.rpm[idx[i]]);
      hi = Math.max(hi, s.rpm[idx[i]]);
    }
    return idx.length > 0 ? hi - lo : 0;
  };
  const spans = picks.map((p) => spanOf(p.idx));
  const mainSpan = spans[mainAt];
  const lineOf = (row: number) => layout.dataStartLine + collector.recordIndexOf(row);
  const origOf = (i: number) => (s.orig ? s.orig[i] : i);

  const pulls: { result: AnalysisResult; main: boolean }[] = [];
  for (let w = 0; w < sweeps.length; w++) {
    const isMain = w === mainAt;
    const picked = picks[w];
    if (picked.idx.length < MIN_POINTS) {
      if (isMain) throw new AnalysisError('TOO_FEW_POINTS', `The sweep has only ${picked.idx.length} data points; at least ${MIN_POINTS} are needed.`);
      continue;
    }
    const first = origOf(picked.idx[0]);
    const last = origOf(picked.idx[picked.idx.length - 1]);
    const extra: AnalysisWarning[] = [];
    // Glitches between the pull's first and last sample.
    const ranges = glitchRanges(s.marks, first, last);
    let inPull = 0;
    for (const r of ranges) inPull += r.to - r.from + 1;
    const rawRpm = collector.rpm.view();
    const rawTime = plan.time !== null ? collector.time.view() : null;
    const described = ranges.map((r) => {
      let lo = Infinity;
      let hi = -Infinity;
      for (let i = r.from; i <= r.to; i++) {
        lo = Math.min(lo, rawRpm[i]);
        hi = Math.max(hi, rawRpm[i]);
      }
      const around = rawRpm[Math.max(0, r.from - 1)];
      return {
        rows: [r.from, r.to] as [number, number],
        lines: [lineOf(r.from), lineOf(r.to)] as [number, number],
        rpmRead: [lo, hi] as [number, number],
        rpmAround: around,
        ...(rawTime ? { time: [roundTime(rawTime[r.from]), roundTime(rawTime[r.to])] as [number, number] } : {}),
      };
    });
    const share = inPull / (picked.idx.length + inPull);
    const glitches: GlitchReport = { dropped: inPull, droppedInLog: s.glitchCount, review: share > GLITCH_REVIEW_FRACTION, ranges: described };
    if (inPull > 0) {
      const where = described
        .slice(0, RANGES_IN_MESSAGE)
        .map((d) => {
          const lines = d.lines[0] === d.lines[1] ? `line ${d.lines[0]}` : `lines ${d.lines[0]}–${d.lines[1]}`;
          const t = d.time ? `, t ${d.time[0]}${d.time[1] !== d.time[0] ? `–${d.time[1]}` : ''} s` : '';
          return `${lines} (read ${fmt(d.rpmRead[0])}${d.rpmRead[1] !== d.rpmRead[0] ? `–${fmt(d.rpmRead[1])}` : ''} rpm near ${fmt(d.rpmAround)} rpm${t})`;
        })
        .join('; ');
      const more = described.length > RANGES_IN_MESSAGE ? `; and ${described.length - RANGES_IN_MESSAGE} more range(s)` : '';
      extra.push({
        code: 'GLITCHES_DROPPED',
        message: `${inPull} sample(s) with impossible engine-speed or load jumps (drop-outs, doubled or halved readings, spikes) were dropped from the pull: ${where}${more}.`,
        details: { dropped: inPull, ranges: described },
      });
    }
    if (glitches.review) {
      extra.push({
        code: 'GLITCHES_REVIEW',
        message: `${(share * 100).toFixed(0)} % of this pull's samples were glitches (over ${GLITCH_REVIEW_FRACTION * 100} %): the engine-speed signal is unreliable. Review the run before using its figures.`,
      });
    }
    if (picked.negative > 0) {
      extra.push({
        code: 'DECEL_EXCLUDED',
        message: `${picked.negative} sample(s) inside the sweep with negative ${plan.torque ? 'torque' : 'power'} (engine braking, coasting) were left out.`,
      });
    }
    const partial = spans[w] < PARTIAL_RISE_FRACTION * mainSpan;
    const timeRange: [number, number] | null = rawTime ? [roundTime(rawTime[first]), roundTime(rawTime[last])] : null;
    const pull: PullInfo = {
      index: 0,
      count: 0,
      main: isMain,
      partial,
      sampleRange: [first, last],
      lineRange: [lineOf(first), lineOf(last)],
      timeRange,
    };
    if (partial) {
      extra.push({
        code: 'PULL_PARTIAL',
        message: `This pull spans only ${fmt(spans[w])} rpm at full throttle, against ${fmt(mainSpan)} rpm for the log's main pull: it looks aborted early.`,
      });
    }
    const result = sweepResult(collector, prepared, opts, s, picked.idx, extra, glitches, pull);
    if (!result) {
      if (isMain) throw new AnalysisError('TOO_FEW_POINTS', 'The sweep covers too narrow an rpm range for the grid.');
      continue;
    }
    pulls.push({ result, main: isMain });
  }
  const count = pulls.length;
  pulls.forEach((p, i) => {
    p.result.pull.index = i;
    p.result.pull.count = count;
  });
  const main = pulls.findIndex((p) => p.main);
  if (count > 1) {
    for (const p of pulls) {
      const { index, lineRange } = p.result.pull;
      p.result.warnings.push({
        code: 'PULLS_FOUND',
        message: `The log holds ${count} pulls; this is pull ${index + 1} (lines ${lineRange[0]}–${lineRange[1]})${p.main ? ', the main one (largest rpm rise)' : `; the main one is pull ${main + 1}`}.`,
      });
    }
  }
  if (collector.tableEnded) {
    const at = collector.tableEndLine;
    for (const p of pulls) {
      p.result.warnings.push({
        code: 'TABLE_ENDED_EARLY',
        message: `The data table ends at line ${at ?? '?'}: a row that is not data (a summary, notes or another table) follows ${collector.numericRows} data rows. The rest of the file was not read.`,
        details: { line: at },
      });
    }
  }
  return { pulls: pulls.map((p) => p.result), main };
}

/**
 * The samples of one sweep to use: part-throttle edges trimmed (end of the lead-in, the
 * throttle-off moment), then every sample with negative load left out (coasting is never part
 * of the sweep). Indices are into the clean series.
 */
function pickSweep(s: CleanSeries, sweep: SweepRange, byTorque: boolean): { idx: Int32Array; negative: number } {
  const load = byTorque ? s.torque : s.power;
  // A part-throttle roll-on before the pull (from idle up to the start rpm) rises with the pull:
  // skip leading samples under half the load of the pull's second half.
  const second = medianOf(load, (sweep.start + sweep.end) >> 1, sweep.end + 1);
  let start = sweep.start;
  while (start < sweep.end && load[start] < PART_THROTTLE_FRACTION * second) start++;
  const edges = trimThrottleEdges(load.subarray(start, sweep.end + 1));
  const from = start + edges.from;
  const to = start + edges.to - 1;
  let negative = 0;
  for (let i = from; i <= to; i++) if (load[i] < 0) negative++;
  const idx = new Int32Array(Math.max(0, to - from + 1 - negative));
  for (let i = from, k = 0; i <= to; i++) if (!(load[i] < 0)) idx[k++] = i;
  return { idx, negative };
}

function medianOf(v: Float32Array, from: number, to: number): number {
  const sorted = v.slice(from, to).sort();
  return sorted.length ? sorted[sorted.length >> 1] : NaN;
}

function scaleInPlace(values: Float32Array | Float64Array, factor: number): void {
  for (let i = 0; i < values.length; i++) values[i] *= factor;
}

function stripUndefined<T extends object>(o: T): Partial<T> {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as Partial<T>;
}

/** One pull's result; null when it covers too narrow an rpm range for the grid. */
function sweepResult(
  collector: RowCollector,
  prepared: PreparedRead,
  opts: ReturnType<typeof normaliseOptions>,
  s: CleanSeries,
  idx: Int32Array,
  extraWarnings: AnalysisWarning[],
  glitches: GlitchReport,
  pull: PullInfo,
): AnalysisResult | null {
  const { plan } = prepared;
  const warnings: AnalysisWarning[] = [...plan.warnings];
  const count = idx.length;
  const rpm = gather(s.rpm, idx);
  let torqueUnit: TorqueUnit | null = plan.torque?.unit ?? null;
  let powerUnit: PowerUnit | null = plan.power?.unit ?? null;
  const rawT = gather(s.torque, idx);
  const rawP = gather(s.power, idx);
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

  const afrSeries = s.afr.map((series, k) => {
    const v = gather(series, idx);
    if (plan.afr[k].lambda) scaleInPlace(v, GASOLINE_STOICH_AFR);
    return v;
  });
  const { grid, values } = resampleToGrid(rpm, [torque, power, ...afrSeries], opts.gridRpm);
  if (grid.length < 5) return null;
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
  warnings.push(...extraWarnings);

  return {
    ok: true,
    columns,
    units: { torque: torqueUnit, power: powerUnit },
    points: count,
    droppedPoints: collector.rpm.length - count + collector.blankRows,
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
    review: glitches.review,
    pull,
    glitches,
  };
}

