/**
 * Comparisons: runs re-corrected to one standard and compared against a baseline with the
 * analysis module (compareCurves, repeatability, applyCorrection, correctionFactor — the one
 * implementation of the math), plus the honesty layer: fairness warnings, run-to-run spread and
 * plain sentences. `evaluateComparison` and `getComparison` are the entry points other modules
 * (the PDF report) call.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { FilterQuery } from '@mikro-orm/core';
import { runColorSlots, type ArchiveRun } from './run-colors';
import { costBetweenStages, stageCostCents, type CostedStage } from './stage-cost';
import type { Actor } from '../../http/actor';
import { AppError, notFound } from '../../lib/errors';
import {
  type ComparisonDetailDto,
  type ComparisonDto,
  type ComparisonInput,
  type ComparisonOptions,
  type ComparisonPreview,
  type ComparisonResult,
  type ComparisonRunSummary,
  type ComparisonUnits,
  type ComparisonWarning,
  type CandidatesDto,
  type StageRepeatability,
  type StageTimelineDto,
  type TimelineGain,
  type TimelineStage,
  MAX_PRESSURE_APART_KPA,
  MAX_TEMPERATURE_APART_C,
  MIN_OVERLAP_FRACTION,
  comparisonPreviewInput,
} from '@shared/schemas/comparison';
import type { CorrectionId } from '@shared/schemas/run';
import { type ComparisonFigures, compareCurves, repeatability } from '@shared/analysis/compare';
import { type CorrectionStandard, CORRECTION_STANDARDS, correctionFactor, isCorrectionStandard } from '@shared/analysis/correction';
import { type NormalizedCurve, applyCorrection, peaksOf } from '@shared/analysis/curve';
import { isAnalysisError } from '@shared/analysis/errors';
import { gridPoints, interpolateSorted } from '@shared/analysis/resample';
import { smoothSavitzkyGolay } from '@shared/analysis/smoothing';
import { cTo, hpTo, kpaTo, lbftTo } from '@shared/analysis/units';
import { Run } from '../runs/run.entity';
import { MAX_STAGE_RUNS, loadPreviewRows, loadRunRows, type RunRow } from './comparison-runs';
import { Stage, Part } from '../stages/stage.entity';
import { Bike } from '../bikes/bike.entity';
import { Shop } from '../shops/shop.entity';
import { User } from '../users/user.entity';
import { Comparison } from './comparison.entity';
import { recordAudit } from '../audit/audit.service';

export type { ComparisonPreview, ComparisonDetailDto } from '@shared/schemas/comparison';

/** Input of {@link evaluateComparison} (options may be partial; defaults are filled in). */
export interface EvaluateInput {
  runIds: string[];
  baselineRunId: string;
  options?: ComparisonOptions;
  /**
   * Colour slots to keep (a saved comparison's). Used only when every run has one; otherwise
   * (comparisons saved before slots were kept) all colours come from the archive.
   */
  colorSlots?: Record<string, number> | null;
}

const DEFAULT_BAND_WIDTH = 1000;
/** A loss smaller than this (hp) is not worth a sentence. Our own threshold. */
const NOTABLE_LOSS_HP = 0.5;
/** Share of the total positive gain area that "most of the gain" means. Our own threshold. */
const MOST_OF_GAIN = 0.75;

interface Prepared {
  run: RunRow;
  curve: NormalizedCurve;
  summary: ComparisonRunSummary;
  warnings: ComparisonWarning[];
}

const bikeLabel = (b: { year: number | null; make: string; model: string }) => [b.year, b.make, b.model].filter((v) => v !== null && v !== undefined && v !== '').join(' ');
const runName = (r: { label: string | null; sequence: number; stage: { name: string } | null }) => r.label || `${r.stage?.name ?? 'Unstaged'} · run ${r.sequence}`;
const standardLabel = (s: string) => CORRECTION_STANDARDS.find((c) => c.id === s)?.label ?? s;
const r4 = (v: number) => Math.round(v * 1e4) / 1e4;
const r3 = (v: number) => Math.round(v * 1e3) / 1e3;
const num = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);

/** Conditions used for correction: the run's own, then its session's for what the file lacked. */
function conditionsOf(run: RunRow) {
  const c = (run.conditions ?? {}) as Record<string, unknown>;
  const s = run.session;
  return {
    temperatureC: num(c.temperatureC) ?? num(s?.ambientTempC),
    baroKpa: num(c.baroKpa) ?? num(s?.baroKpa),
    humidityPct: num(c.humidityPct) ?? num(s?.humidityPct),
  };
}

/**
 * Corrects (and optionally smooths) one run's stored uncorrected curve. With a chosen standard
 * the factor is recomputed from the run's conditions; when they are missing the stored factor is
 * kept and a warning says so.
 */
function prepare(run: RunRow, options: ComparisonOptions): Prepared {
  const warnings: ComparisonWarning[] = [];
  const stored = run.curve;
  if (run.status !== 'ready' || !stored || stored.rpm.length < 2) {
    throw new AppError('RUN_NOT_READY', `Run “${runName(run)}” has no analysed curve yet; finish its column mapping or remove it from the comparison.`, 422, { runId: run.id });
  }
  const conditions = conditionsOf(run);
  const storedStandard: CorrectionStandard = run.correctionFactor !== null && isCorrectionStandard(run.correctionStandard) ? run.correctionStandard : 'none';
  const storedFactor = run.correctionFactor ?? 1;
  let standard = storedStandard;
  let factor = storedFactor;
  let source: ComparisonRunSummary['correction']['source'] = 'stored';
  if (options.correction) {
    try {
      factor = correctionFactor(options.correction, {
        temperatureC: conditions.temperatureC ?? undefined,
        baroKpa: conditions.baroKpa ?? undefined,
        humidityPct: conditions.humidityPct ?? undefined,
      });
      standard = options.correction;
      source = 'recomputed';
    } catch (e) {
      if (!isAnalysisError(e)) throw e;
      source = 'fallback';
      warnings.push({
        code: 'CONDITIONS_MISSING',
        message: `“${runName(run)}” cannot be corrected to ${standardLabel(options.correction)}: ${e.message} Its stored correction (${standardLabel(storedStandard)}, factor ${storedFactor.toFixed(3)}) is used instead.`,
        runIds: [run.id],
      });
    }
  }
  const w = options.smooth ?? 0;
  const base: NormalizedCurve =
    w >= 3
      ? { rpm: stored.rpm, torqueLbft: smoothSavitzkyGolay(stored.torqueLbft, w), powerHp: smoothSavitzkyGolay(stored.powerHp, w), afr: {} }
      : { rpm: stored.rpm, torqueLbft: stored.torqueLbft, powerHp: stored.powerHp, afr: {} };
  const curve = applyCorrection(base, factor);
  const range = options.rpmRange;
  const scoped = range ? clip(curve, range) : curve;
  const peaks = peaksOf(scoped.rpm.length ? scoped : curve);
  const dyno = run.session?.dyno ?? null;
  return {
    run,
    curve,
    warnings,
    summary: {
      runId: run.id,
      name: runName(run),
      colorIndex: 0,
      bikeId: run.bike.id,
      bikeLabel: bikeLabel(run.bike),
      stageId: run.stage?.id ?? null,
      stageName: run.stage?.name ?? null,
      sessionId: run.session?.id ?? null,
      dynoId: dyno?.id ?? null,
      dynoName: dyno?.name ?? null,
      recordedAt: (run.session?.startedAt ?? run.createdAt).toISOString(),
      identityStatus: run.identityStatus,
      conditions,
      correction: { standard: standard as CorrectionId, factor: r4(factor), source },
      rpmMin: curve.rpm[0],
      rpmMax: curve.rpm[curve.rpm.length - 1],
      peakPower: { hp: r4(peaks.peakPower.hp), rpm: peaks.peakPower.rpm },
      peakTorque: { lbft: r4(peaks.peakTorque.lbft), rpm: peaks.peakTorque.rpm },
    },
  };
}

/** Keeps the samples inside an rpm range (no interpolation: used for peaks only). */
function clip(c: NormalizedCurve, [lo, hi]: [number, number]): NormalizedCurve {
  const keep = c.rpm.map((r) => r >= lo && r <= hi);
  const pick = (v: number[]) => v.filter((_, i) => keep[i]);
  return { rpm: pick(c.rpm), torqueLbft: pick(c.torqueLbft), powerHp: pick(c.powerHp), afr: {} };
}

function compareOrThrow(base: Prepared, other: Prepared, options: ComparisonOptions): ComparisonFigures {
  try {
    return compareCurves(base.curve, other.curve, { bandWidthRpm: options.bandWidthRpm ?? DEFAULT_BAND_WIDTH, rpmRange: options.rpmRange });
  } catch (e) {
    if (isAnalysisError(e)) {
      throw new AppError(e.code, `“${other.summary.name}” and the baseline “${base.summary.name}”: ${e.message}`, 422, { runIds: [base.run.id, other.run.id] });
    }
    throw e;
  }
}

// ---- fairness

// Both unit systems in warnings: they are read on screens and in PDFs of either (°F = °C × 1.8 + 32;
// 1 inHg = 3.38638 kPa, NIST SP 811).
const airTemp = (c: number) => `${c.toFixed(1)} °C / ${cTo(c, 'f').toFixed(1)} °F`;
const baro = (kpa: number) => `${kpa.toFixed(1)} kPa / ${kpaTo(kpa, 'inhg').toFixed(2)} inHg`;

function fairnessWarnings(all: Prepared[], baseline: Prepared): ComparisonWarning[] {
  const out: ComparisonWarning[] = all.flatMap((p) => p.warnings);
  const ids = all.map((p) => p.run.id);
  const list = (ps: Prepared[]) => ps.map((p) => `“${p.summary.name}”`).join(', ');

  const standards = new Set(all.map((p) => p.summary.correction.standard));
  if (standards.size > 1) {
    out.push({
      code: 'MIXED_CORRECTION',
      message: `The runs are corrected to different standards (${[...standards].map(standardLabel).join(', ')}); figures are only comparable under one standard. Choose a correction standard for all runs.`,
      runIds: ids,
    });
  }
  const dynos = new Map<string, string>();
  for (const p of all) if (p.summary.dynoId) dynos.set(p.summary.dynoId, p.summary.dynoName ?? 'unnamed dyno');
  if (dynos.size > 1) {
    out.push({
      code: 'DIFFERENT_DYNOS',
      message: `The runs were made on different dynos (${[...dynos.values()].join(', ')}); dynos read differently, so part of any difference may be the dyno.`,
      runIds: ids,
    });
  } else {
    const unknown = all.filter((p) => !p.summary.dynoId);
    if (unknown.length && unknown.length < all.length) {
      out.push({
        code: 'DYNO_UNKNOWN',
        message: `No dyno is recorded for ${list(unknown)}; check that every run was made on the same dyno.`,
        runIds: unknown.map((p) => p.run.id),
      });
    }
  }
  const spreadOf = (key: 'temperatureC' | 'baroKpa') => {
    const known = all.filter((p) => p.summary.conditions[key] !== null);
    if (known.length < 2) return null;
    const lo = known.reduce((a, b) => (b.summary.conditions[key]! < a.summary.conditions[key]! ? b : a));
    const hi = known.reduce((a, b) => (b.summary.conditions[key]! > a.summary.conditions[key]! ? b : a));
    return { lo, hi, apart: hi.summary.conditions[key]! - lo.summary.conditions[key]! };
  };
  const t = spreadOf('temperatureC');
  if (t && t.apart > MAX_TEMPERATURE_APART_C) {
    out.push({
      code: 'TEMPERATURE_APART',
      message: `Air temperature differs by ${t.apart.toFixed(1)} °C / ${(t.apart * 1.8).toFixed(1)} °F (${airTemp(t.lo.summary.conditions.temperatureC!)} for “${t.lo.summary.name}”, ${airTemp(t.hi.summary.conditions.temperatureC!)} for “${t.hi.summary.name}”); correction does not fully even out more than ${MAX_TEMPERATURE_APART_C} °C (${MAX_TEMPERATURE_APART_C * 1.8} °F).`,
      runIds: [t.lo.run.id, t.hi.run.id],
    });
  }
  const p = spreadOf('baroKpa');
  if (p && p.apart > MAX_PRESSURE_APART_KPA) {
    out.push({
      code: 'PRESSURE_APART',
      message: `Barometric pressure differs by ${p.apart.toFixed(1)} kPa / ${kpaTo(p.apart, 'inhg').toFixed(2)} inHg (“${p.lo.summary.name}” ${baro(p.lo.summary.conditions.baroKpa!)}, “${p.hi.summary.name}” ${baro(p.hi.summary.conditions.baroKpa!)}); more than ${MAX_PRESSURE_APART_KPA} kPa (${kpaTo(MAX_PRESSURE_APART_KPA, 'inhg').toFixed(2)} inHg) apart.`,
      runIds: [p.lo.run.id, p.hi.run.id],
    });
  }
  const mismatch = all.filter((x) => x.summary.identityStatus === 'mismatch');
  if (mismatch.length) {
    out.push({
      code: 'CROSS_CHECK_MISMATCH',
      message: `In ${list(mismatch)} power does not match torque × rpm (cross-check failed); check the file's columns and units before trusting the figures.`,
      runIds: mismatch.map((x) => x.run.id),
    });
  }
  for (const o of all) {
    if (o === baseline) continue;
    const lo = Math.max(o.summary.rpmMin, baseline.summary.rpmMin);
    const hi = Math.min(o.summary.rpmMax, baseline.summary.rpmMax);
    const narrower = Math.min(o.summary.rpmMax - o.summary.rpmMin, baseline.summary.rpmMax - baseline.summary.rpmMin);
    const overlap = Math.max(0, hi - lo);
    if (narrower > 0 && overlap < MIN_OVERLAP_FRACTION * narrower) {
      out.push({
        code: 'LITTLE_OVERLAP',
        message: `“${o.summary.name}” and the baseline share only ${Math.round(overlap)} rpm (${Math.round((overlap / narrower) * 100)} % of the narrower run's range); the area and average figures cover only that slice.`,
        runIds: [baseline.run.id, o.run.id],
      });
    }
  }
  const bikes = new Set(all.map((x) => x.summary.bikeId));
  if (bikes.size > 1) {
    out.push({
      code: 'SEVERAL_BIKES',
      message: `The runs come from ${bikes.size} different bikes; differences include everything that differs between the bikes, not only the parts.`,
      runIds: ids,
    });
  }
  return out;
}

// ---- repeatability

interface StageSpread {
  info: StageRepeatability;
  /** Band spread keyed by the band's aligned start rpm. */
  bands: Map<number, number>;
}

/**
 * Run-to-run spread of each stage with 2+ ready runs. `runs` are the candidate runs, newest first
 * (from {@link loadRunRows}); runs already prepared with the same options (`known`) are reused.
 */
function stageSpreads(runs: RunRow[], stageIds: string[], options: ComparisonOptions, known: Map<string, Prepared>): Map<string, StageSpread> {
  const out = new Map<string, StageSpread>();
  if (!stageIds.length) return out;
  const width = options.bandWidthRpm ?? DEFAULT_BAND_WIDTH;
  for (const stageId of stageIds) {
    const prepared = runs
      .filter((r) => r.status === 'ready' && r.stage?.id === stageId && r.curve)
      .slice(0, MAX_STAGE_RUNS)
      .map((r) => known.get(r.id) ?? prepare(r, options));
    if (prepared.length < 2) continue;
    let rep;
    try {
      rep = repeatability(prepared.map((p) => p.curve));
    } catch (e) {
      if (isAnalysisError(e)) continue;
      throw e;
    }
    const first = prepared[0];
    const avgs = [0];
    const bandValues = new Map<number, number[]>();
    for (const other of prepared.slice(1)) {
      let f: ComparisonFigures;
      try {
        f = compareCurves(first.curve, other.curve, { bandWidthRpm: width, rpmRange: options.rpmRange });
      } catch (e) {
        if (isAnalysisError(e)) continue;
        throw e;
      }
      avgs.push(f.averagePowerGainHp);
      for (const b of f.bands) {
        const key = Math.floor(b.from / width) * width;
        const v = bandValues.get(key) ?? [0];
        v.push(b.averagePowerGainHp);
        bandValues.set(key, v);
      }
    }
    const range = (v: number[]) => Math.max(...v) - Math.min(...v);
    out.set(stageId, {
      info: {
        stageId,
        stageName: first.run.stage!.name,
        bikeId: first.run.bike.id,
        runIds: prepared.map((p) => p.run.id),
        runs: rep.runs,
        peakPowerSpreadHp: r4(rep.peakPowerSpreadHp),
        peakTorqueSpreadLbft: r4(rep.peakTorqueSpreadLbft),
        averagePowerSpreadHp: r4(range(avgs)),
        largestDeviationHp: r4(rep.largestDeviationHp),
        largestDeviationRpm: rep.largestDeviationRpm,
      },
      bands: new Map([...bandValues].map(([k, v]) => [k, range(v)])),
    });
  }
  return out;
}

/** The larger of two known spreads (null when neither is known). */
function maxKnown(a: number | null | undefined, b: number | null | undefined): number | null {
  const known = [a, b].filter((v): v is number => typeof v === 'number');
  return known.length ? Math.max(...known) : null;
}
const within = (gain: number, spread: number | null) => (spread === null ? null : Math.abs(gain) <= spread);

// ---- sentences

interface Units {
  power: (hp: number) => number;
  torque: (lbft: number) => number;
  p: string;
  t: string;
}
function unitsOf(u: ComparisonUnits): Units {
  return u === 'kw-nm'
    ? { power: (v) => hpTo(v, 'kw'), torque: (v) => lbftTo(v, 'nm'), p: 'kW', t: 'N·m' }
    : { power: (v) => v, torque: (v) => v, p: 'hp', t: 'lb·ft' };
}
const signed = (v: number, d = 1) => {
  const s = Math.abs(v).toFixed(d);
  if (Number(s) === 0) return `±${s}`;
  return `${v > 0 ? '+' : '−'}${s}`;
};
const rpmText = (v: number) => Math.round(v).toLocaleString('en-US');

/** Plain sentences for one run against the baseline, from its figures only. */
export function describeResult(r: Omit<ComparisonResult, 'sentences'>, units: ComparisonUnits): string[] {
  const u = unitsOf(units);
  const parts: string[] = [];
  const peak = `${signed(u.power(r.peakPowerGain.hp))} ${u.p} at peak (${signed(r.peakPowerGain.pct)} %)`;
  parts.push(r.withinRepeatability.peakPower ? `${peak}, which is within run-to-run spread` : peak);

  const bands = r.bands;
  const positive = bands.map((b) => Math.max(0, b.averagePowerGainHp) * (b.to - b.from));
  const total = positive.reduce((s, v) => s + v, 0);
  if (total > 0 && bands.length >= 3) {
    let acc = 0;
    let above = bands.length - 1;
    for (let i = bands.length - 1; i >= 0; i--) {
      acc += positive[i];
      above = i;
      if (acc >= MOST_OF_GAIN * total) break;
    }
    acc = 0;
    let below = 0;
    for (let i = 0; i < bands.length; i++) {
      acc += positive[i];
      below = i;
      if (acc >= MOST_OF_GAIN * total) break;
    }
    if (above > 0 && bands.length - above <= below + 1) parts.push(`most of the gain is above ${rpmText(bands[above].from)} rpm`);
    else if (below < bands.length - 1) parts.push(`most of the gain is below ${rpmText(bands[below].to)} rpm`);
    else parts.push('the gain is spread across the range');
  } else if (r.averagePowerGainHp < 0) {
    parts.push(`on average ${signed(u.power(r.averagePowerGainHp))} ${u.p} across ${rpmText(r.commonRpm[0])}–${rpmText(r.commonRpm[1])} rpm`);
  }
  if (bands.length && bands.every((b) => b.withinRepeatability === true)) {
    parts.push('across the whole range the change is within run-to-run spread');
  } else {
    let low = -1;
    while (low + 1 < bands.length && bands[low + 1].withinRepeatability === true) low++;
    let high = bands.length;
    while (high - 1 > low && bands[high - 1].withinRepeatability === true) high--;
    if (low >= 0) parts.push(`below ${rpmText(bands[low].to)} rpm the change is within run-to-run spread`);
    if (high < bands.length) parts.push(`above ${rpmText(bands[high].from)} rpm the change is within run-to-run spread`);
  }
  const first = `${parts.join('; ')}.`;
  const second: string[] = [];
  second.push(`Peak torque ${signed(u.torque(r.peakTorqueGain.lbft))} ${u.t} (${signed(r.peakTorqueGain.pct)} %)`);
  if (Math.abs(r.peakPowerRpmShift) >= 200) second.push(`peak power moved ${rpmText(Math.abs(r.peakPowerRpmShift))} rpm ${r.peakPowerRpmShift > 0 ? 'higher' : 'lower'}`);
  if (r.largestLoss.hp <= -NOTABLE_LOSS_HP) second.push(`it gives away up to ${Math.abs(u.power(r.largestLoss.hp)).toFixed(1)} ${u.p} around ${rpmText(r.largestLoss.rpm)} rpm`);
  return [first, `${second.join('; ')}.`];
}

// ---- evaluation

function alignedCurves(all: Prepared[], options: ComparisonOptions): ComparisonPreview['curves'] {
  let lo = Math.min(...all.map((p) => p.summary.rpmMin));
  let hi = Math.max(...all.map((p) => p.summary.rpmMax));
  if (options.rpmRange) {
    lo = Math.max(lo, options.rpmRange[0]);
    hi = Math.min(hi, options.rpmRange[1]);
  }
  const step = Math.min(...all.map((p) => (p.curve.rpm.length >= 2 ? p.curve.rpm[1] - p.curve.rpm[0] : 50)));
  const grid = hi > lo ? gridPoints(lo, hi, step) : [];
  return {
    rpm: grid,
    runs: all.map((p) => {
      const c = p.curve;
      const a = c.rpm[0];
      const b = c.rpm[c.rpm.length - 1];
      const pw = interpolateSorted(c.rpm, c.powerHp, grid);
      const tq = interpolateSorted(c.rpm, c.torqueLbft, grid);
      const inside = (g: number) => g >= a - 1e-9 && g <= b + 1e-9;
      return {
        runId: p.run.id,
        powerHp: grid.map((g, i) => (inside(g) ? r3(pw[i]) : null)),
        torqueLbft: grid.map((g, i) => (inside(g) ? r3(tq[i]) : null)),
      };
    }),
  };
}

function parseInput(input: EvaluateInput) {
  const parsed = comparisonPreviewInput.safeParse({ ...input, options: input.options ?? {} });
  if (!parsed.success) {
    const first = parsed.error.issues[0];
    throw new AppError('VALIDATION_FAILED', `Invalid comparison: ${first.path.join('.') || 'input'} — ${first.message}`, 400, {
      fields: parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message })),
    });
  }
  return parsed.data;
}

/**
 * Computes a comparison: each run corrected (to `options.correction` when given, else its stored
 * correction), compared against the baseline over the common range, with fairness warnings,
 * run-to-run spread of every stage involved that has 2+ ready runs, and plain sentences.
 * Runs must all be visible to the actor (shop; customers: their own bikes) — else 404.
 */
/** Colour slots of the compared runs from their bikes' archives (run-colors.ts); `rows` hold every visible run of those bikes. */
function colorSlotsOf(rows: RunRow[], all: Prepared[]): Map<string, number> {
  const bikeIds = new Set(all.map((p) => p.run.bike.id));
  const archive: ArchiveRun[] = rows
    .filter((r) => bikeIds.has(r.bike.id))
    .map((r) => ({ id: r.id, bikeId: r.bike.id, stagePosition: r.stage?.position ?? null, sequence: r.sequence, createdAt: r.createdAt }));
  return runColorSlots(archive, all.map((p) => p.run.id));
}

export async function evaluateComparison(em: EntityManager, actor: Actor, input: EvaluateInput): Promise<ComparisonPreview> {
  const data = parseInput(input);
  const options = data.options;
  const rows = await loadPreviewRows(em, actor, data.runIds);
  const byId = new Map(rows.map((r) => [r.id, r]));
  if (!data.runIds.every((id) => byId.has(id))) throw notFound('Run');
  const all = data.runIds.map((id) => prepare(byId.get(id)!, options));
  const baseline = all.find((p) => p.run.id === data.baselineRunId)!;
  const warnings = fairnessWarnings(all, baseline);

  const stageIds = [...new Set(all.map((p) => p.summary.stageId).filter((s): s is string => !!s))];
  const spreads = stageSpreads(rows, stageIds, options, new Map(all.map((p) => [p.run.id, p])));
  const width = options.bandWidthRpm ?? DEFAULT_BAND_WIDTH;
  const units = options.units ?? 'hp-lbft';
  const baseSpread = baseline.summary.stageId ? spreads.get(baseline.summary.stageId) : undefined;

  const results: ComparisonResult[] = all
    .filter((p) => p !== baseline)
    .map((p) => {
      const f = compareOrThrow(baseline, p, options);
      const own = p.summary.stageId ? spreads.get(p.summary.stageId) : undefined;
      const spread = {
        peakPowerHp: maxKnown(baseSpread?.info.peakPowerSpreadHp, own?.info.peakPowerSpreadHp),
        peakTorqueLbft: maxKnown(baseSpread?.info.peakTorqueSpreadLbft, own?.info.peakTorqueSpreadLbft),
        averagePowerHp: maxKnown(baseSpread?.info.averagePowerSpreadHp, own?.info.averagePowerSpreadHp),
      };
      const bands = f.bands.map((b) => {
        const key = Math.floor(b.from / width) * width;
        const s = maxKnown(baseSpread?.bands.get(key), own?.bands.get(key));
        return {
          from: b.from,
          to: b.to,
          averagePowerGainHp: r4(b.averagePowerGainHp),
          averageTorqueGainLbft: r4(b.averageTorqueGainLbft),
          spreadHp: s === null ? null : r4(s),
          withinRepeatability: within(b.averagePowerGainHp, s),
        };
      });
      const result: Omit<ComparisonResult, 'sentences'> = {
        runId: p.run.id,
        commonRpm: f.commonRpm,
        peakPowerGain: { hp: r4(f.peakPowerGain.hp), pct: r4(f.peakPowerGain.pct) },
        peakTorqueGain: { lbft: r4(f.peakTorqueGain.lbft), pct: r4(f.peakTorqueGain.pct) },
        peakPowerRpmShift: f.peakPowerRpmShift,
        peakTorqueRpmShift: f.peakTorqueRpmShift,
        areaGainPct: r4(f.areaGainPct),
        averagePowerGainHp: r4(f.averagePowerGainHp),
        averageTorqueGainLbft: r4(f.averageTorqueGainLbft),
        bands,
        largestGain: { rpm: f.largestGain.rpm, hp: r4(f.largestGain.hp) },
        largestLoss: { rpm: f.largestLoss.rpm, hp: r4(f.largestLoss.hp) },
        spread,
        withinRepeatability: {
          peakPower: within(f.peakPowerGain.hp, spread.peakPowerHp),
          peakTorque: within(f.peakTorqueGain.lbft, spread.peakTorqueLbft),
          averagePower: within(f.averagePowerGainHp, spread.averagePowerHp),
        },
        delta: { rpm: f.delta.rpm, powerHp: f.delta.powerHp.map(r3), torqueLbft: f.delta.torqueLbft.map(r3) },
      };
      return { ...result, sentences: describeResult(result, units) };
    });

  const summary: string[] = [];
  if (results.length === 1) summary.push(...results[0].sentences);
  else {
    for (const r of results) {
      const name = all.find((p) => p.run.id === r.runId)!.summary.name;
      summary.push(`${name} against ${baseline.summary.name}: ${r.sentences[0].charAt(0).toLowerCase()}${r.sentences[0].slice(1)}`);
    }
  }
  if (!spreads.size) summary.push('No stage in this comparison has two or more runs, so run-to-run spread is unknown; treat small differences with care.');
  if (warnings.some((w) => w.code !== 'SEVERAL_BIKES' && w.code !== 'DYNO_UNKNOWN')) summary.push('Read these figures with the warnings below in mind.');

  const kept = input.colorSlots ?? {};
  const colors = data.runIds.every((id) => Number.isInteger(kept[id])) ? new Map(Object.entries(kept)) : colorSlotsOf(rows, all);
  for (const p of all) p.summary.colorIndex = colors.get(p.run.id) ?? 0;

  return {
    baseline: baseline.summary,
    runs: all.map((p) => p.summary),
    results,
    curves: alignedCurves(all, options),
    warnings,
    summary,
    repeatability: [...spreads.values()].map((s) => s.info),
    options: {
      correction: options.correction ?? null,
      smooth: options.smooth ?? 0,
      units,
      rpmRange: options.rpmRange ?? null,
      bandWidthRpm: width,
    },
  };
}

// ---- saved comparisons

function comparisonScope(actor: Actor): FilterQuery<Comparison> {
  const where: Record<string, unknown> = { shop: actor.shopId };
  if (actor.role === 'customer') where.bike = { customer: actor.customerId ?? '00000000-0000-0000-0000-000000000000' };
  return where as FilterQuery<Comparison>;
}

function toDto(c: Comparison): ComparisonDto {
  return {
    id: c.id,
    name: c.name,
    bikeId: c.bike.id,
    bikeLabel: bikeLabel(c.bike),
    runIds: c.runIds,
    baselineRunId: c.baselineRun.id,
    options: c.options as ComparisonOptions,
    note: c.note,
    createdAt: c.createdAt.toISOString(),
    createdByName: c.createdBy?.name ?? null,
  };
}

/** Saves a comparison (after computing it once, so a saved comparison is always computable). */
export async function createComparison(em: EntityManager, actor: Actor, input: ComparisonInput): Promise<ComparisonDto> {
  const preview = await evaluateComparison(em, actor, input);
  const baseline = await em.findOneOrFail(Run, { id: input.baselineRunId, shop: actor.shopId }, { populate: ['bike'] });
  const c = em.create(Comparison, {
    shop: em.getReference(Shop, actor.shopId),
    name: input.name,
    bike: baseline.bike,
    baselineRun: baseline,
    runIds: input.runIds,
    options: input.options as Record<string, unknown>,
    note: input.note ?? null,
    colorSlots: Object.fromEntries(preview.runs.map((r) => [r.runId, r.colorIndex])),
    createdBy: em.getReference(User, actor.id),
  } as Comparison);
  await em.flush();
  await recordAudit(em, actor, 'comparison.create', 'comparison', c.id, { name: c.name, runIds: c.runIds });
  await em.populate(c, ['createdBy', 'bike']);
  return toDto(c);
}

async function findComparison(em: EntityManager, actor: Actor, id: string): Promise<Comparison> {
  const c = await em.findOne(Comparison, { ...(comparisonScope(actor) as object), id } as FilterQuery<Comparison>, { populate: ['bike', 'createdBy'] });
  if (!c) throw notFound('Comparison');
  return c;
}

/** A saved comparison and its figures computed now (previewError says why when they cannot be). */
export async function getComparison(em: EntityManager, actor: Actor, id: string): Promise<ComparisonDetailDto> {
  const c = await findComparison(em, actor, id);
  const comparison = toDto(c);
  try {
    const preview = await evaluateComparison(em, actor, { runIds: c.runIds, baselineRunId: c.baselineRun.id, options: c.options as ComparisonOptions, colorSlots: c.colorSlots });
    return { comparison, preview, previewError: null };
  } catch (e) {
    if (e instanceof AppError && e.status < 500) {
      const message = e.status === 404 ? 'A run of this comparison was deleted or is not visible to you.' : e.message;
      return { comparison, preview: null, previewError: { code: e.code, message } };
    }
    throw e;
  }
}

/** Saved comparisons, newest first, optionally of one bike. */
export async function listComparisons(em: EntityManager, actor: Actor, query: { bikeId?: string }): Promise<ComparisonDto[]> {
  const where = { ...(comparisonScope(actor) as object) } as Record<string, unknown>;
  if (query.bikeId) where.bike = actor.role === 'customer' ? { id: query.bikeId, customer: actor.customerId } : query.bikeId;
  const rows = await em.find(Comparison, where as FilterQuery<Comparison>, { populate: ['bike', 'createdBy'], orderBy: { createdAt: 'desc' }, limit: 500 });
  return rows.map(toDto);
}

export async function deleteComparison(em: EntityManager, actor: Actor, id: string): Promise<void> {
  const c = await findComparison(em, actor, id);
  await em.removeAndFlush(c);
  await recordAudit(em, actor, 'comparison.delete', 'comparison', id, { name: c.name });
}

// ---- stage timeline

function gainOf(f: ComparisonFigures, spread: { peak: number | null; avg: number | null }): TimelineGain {
  return {
    peakPowerHp: r4(f.peakPowerGain.hp),
    peakPowerPct: r4(f.peakPowerGain.pct),
    peakTorqueLbft: r4(f.peakTorqueGain.lbft),
    averagePowerHp: r4(f.averagePowerGainHp),
    areaPct: r4(f.areaGainPct),
    withinRepeatability: { peakPower: within(f.peakPowerGain.hp, spread.peak), averagePower: within(f.averagePowerGainHp, spread.avg) },
  };
}
const perHp = (cents: number, gain: number) => (gain > 0 ? Math.round(cents / gain) : null);

/**
 * A bike's build history: every stage in order with its reference figures, the gain against the
 * previous stage and against the first (baseline) stage, parts and costs, cost per horsepower,
 * and the stage's run-to-run spread.
 */
export async function stageTimeline(em: EntityManager, actor: Actor, query: { bikeId: string; correction?: CorrectionId }): Promise<StageTimelineDto> {
  const bikeWhere: Record<string, unknown> = { id: query.bikeId, shop: actor.shopId };
  if (actor.role === 'customer') bikeWhere.customer = actor.customerId ?? '00000000-0000-0000-0000-000000000000';
  const bike = await em.findOne(Bike, bikeWhere as FilterQuery<Bike>);
  if (!bike) throw notFound('Bike');
  const stages = await em.find(Stage, { bike, shop: actor.shopId }, { orderBy: { position: 'asc', createdAt: 'asc' } });
  const parts = stages.length ? await em.find(Part, { stage: { $in: stages.map((s) => s.id) } }, { orderBy: { createdAt: 'asc' } }) : [];
  const options: ComparisonOptions = { correction: query.correction };
  const refIds = stages.map((s) => s.referenceRun?.id).filter((v): v is string => !!v);
  const stageIds = stages.map((s) => s.id);
  const rows = await loadRunRows(em, actor, refIds, stageIds);
  const rowById = new Map(rows.map((r) => [r.id, r]));
  const refs = [...new Set(refIds)].map((id) => rowById.get(id)).filter((r): r is RunRow => !!r);
  const prepared = new Map<string, Prepared>();
  const warnings: ComparisonWarning[] = [];
  for (const r of refs) {
    try {
      prepared.set(r.id, prepare(r, options));
    } catch (e) {
      if (!(e instanceof AppError)) throw e;
    }
  }
  const spreads = stageSpreads(rows, stageIds, options, prepared);
  const used = [...prepared.values()];
  if (used.length >= 2) warnings.push(...fairnessWarnings(used, used[0]).filter((w) => w.code !== 'LITTLE_OVERLAP'));

  let baseline: { stage: Stage; p: Prepared } | null = null;
  let previous: { stage: Stage; p: Prepared } | null = null;
  let cumulative = 0;
  const out: TimelineStage[] = [];
  // The same cost rule as the gain report (stage-cost.ts): a gain from stage A to stage B is paid
  // for by every stage after A up to B, including stages in between without a reference run.
  const costed: CostedStage[] = stages.map((st) => ({ id: st.id, name: st.name, costCents: stageCostCents(st, parts.filter((x) => x.stage.id === st.id)) }));
  for (const [index, stage] of stages.entries()) {
    const stageParts = parts.filter((x) => x.stage.id === stage.id);
    const cost = costed[index].costCents;
    cumulative += cost;
    const p = stage.referenceRun ? prepared.get(stage.referenceRun.id) : undefined;
    const own = spreads.get(stage.id);
    const row: TimelineStage = {
      stageId: stage.id,
      name: stage.name,
      position: stage.position,
      date: stage.date,
      referenceRunId: stage.referenceRun?.id ?? null,
      reference: p
        ? { peakPowerHp: p.summary.peakPower.hp, peakPowerRpm: p.summary.peakPower.rpm, peakTorqueLbft: p.summary.peakTorque.lbft, peakTorqueRpm: p.summary.peakTorque.rpm, correction: p.summary.correction.standard }
        : null,
      parts: stageParts.map((x) => ({ id: x.id, category: x.category, description: x.description, partCostCents: x.partCostCents, labourCostCents: x.labourCostCents })),
      costCents: cost,
      cumulativeCostCents: cumulative,
      vsPrevious: null,
      vsBaseline: null,
      costPerHp: null,
      cumulativeCostPerHp: null,
      repeatability: own?.info ?? null,
    };
    if (p) {
      const spreadVs = (other: Stage) => {
        const o = spreads.get(other.id);
        return { peak: maxKnown(o?.info.peakPowerSpreadHp, own?.info.peakPowerSpreadHp), avg: maxKnown(o?.info.averagePowerSpreadHp, own?.info.averagePowerSpreadHp) };
      };
      const safe = (a: Prepared, b: Prepared) => {
        try {
          return compareCurves(a.curve, b.curve, { bandWidthRpm: DEFAULT_BAND_WIDTH });
        } catch (e) {
          if (isAnalysisError(e)) return null;
          throw e;
        }
      };
      if (previous) {
        const f = safe(previous.p, p);
        if (f) {
          row.vsPrevious = gainOf(f, spreadVs(previous.stage));
          const spent = costBetweenStages(costed, previous.stage.id, stage.id)?.totalCents ?? cost;
          row.costPerHp = { peakCents: perHp(spent, f.peakPowerGain.hp), averageCents: perHp(spent, f.averagePowerGainHp) };
        }
      }
      if (baseline) {
        const f = safe(baseline.p, p);
        if (f) {
          row.vsBaseline = gainOf(f, spreadVs(baseline.stage));
          const spent = costBetweenStages(costed, baseline.stage.id, stage.id)?.totalCents ?? 0;
          row.cumulativeCostPerHp = { peakCents: perHp(spent, f.peakPowerGain.hp), averageCents: perHp(spent, f.averagePowerGainHp) };
        }
      }
      if (!baseline) baseline = { stage, p };
      previous = { stage, p };
    }
    out.push(row);
  }
  return { bikeId: bike.id, bikeLabel: bikeLabel(bike), correction: query.correction ?? null, stages: out, warnings };
}

// ---- builder candidates

/**
 * A bike's runs for the comparison builder, newest first, and the default suggestion: the
 * reference run of the previous stage against the reference run of the latest stage.
 */
export async function comparisonCandidates(em: EntityManager, actor: Actor, query: { bikeId: string }): Promise<CandidatesDto> {
  const bike = await em.findOne(Bike, { id: query.bikeId, shop: actor.shopId });
  if (!bike) throw notFound('Bike');
  const [runs, stages] = await Promise.all([
    em.find(Run, { shop: actor.shopId, bike, deletedAt: null }, { populate: ['stage', 'session'], orderBy: { createdAt: 'desc' }, limit: 300 }),
    em.find(Stage, { shop: actor.shopId, bike }, { orderBy: { position: 'asc', createdAt: 'asc' } }),
  ]);
  const refs = new Set(stages.map((s) => s.referenceRun?.id).filter(Boolean));
  const ready = new Map(runs.filter((r) => r.status === 'ready').map((r) => [r.id, r]));
  const refStages = stages.filter((s) => s.referenceRun && ready.has(s.referenceRun.id));
  let suggestion: CandidatesDto['suggestion'] = null;
  if (refStages.length >= 2) {
    const [prev, cur] = refStages.slice(-2);
    suggestion = { baselineRunId: prev.referenceRun!.id, runIds: [prev.referenceRun!.id, cur.referenceRun!.id] };
  } else {
    const newest = [...ready.values()].slice(0, 2).reverse();
    if (newest.length === 2) suggestion = { baselineRunId: newest[0].id, runIds: newest.map((r) => r.id) };
  }
  return {
    bikeId: bike.id,
    bikeLabel: bikeLabel(bike),
    runs: runs.map((r) => ({
      id: r.id,
      name: runName(r),
      status: r.status,
      stageId: r.stage?.id ?? null,
      stageName: r.stage?.name ?? null,
      stagePosition: r.stage?.position ?? null,
      isReference: refs.has(r.id),
      recordedAt: (r.session?.startedAt ?? r.createdAt).toISOString(),
      peakPowerHp: r.peakPowerHp,
      peakPowerRpm: r.peakPowerRpm,
      peakTorqueLbft: r.peakTorqueLbft,
      rpmMin: r.rpmMin,
      rpmMax: r.rpmMax,
      correctionStandard: r.correctionStandard,
      identityStatus: r.identityStatus,
    })),
    suggestion,
  };
}
