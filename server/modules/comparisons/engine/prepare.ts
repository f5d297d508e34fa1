/**
 * Preparing runs for a comparison: each run's stored curve corrected to one standard (recomputed
 * from its air conditions, or its stored factor), optionally smoothed, its peaks within the rpm
 * range; pairs compared over their common range; all curves put on one rpm grid for the chart.
 */
import type { ComparisonOptions, ComparisonPreview, ComparisonRunSummary, ComparisonWarning } from '@shared/schemas/comparison';
import type { CorrectionId } from '@shared/schemas/run';
import { type ComparisonFigures, compareCurves } from '@shared/analysis/compare';
import { type CorrectionStandard, correctionFactor, isCorrectionStandard } from '@shared/analysis/correction';
import { type NormalizedCurve, applyCorrection, peaksOf } from '@shared/analysis/curve';
import { isAnalysisError } from '@shared/analysis/errors';
import { gridPoints, interpolateSorted } from '@shared/analysis/resample';
import { smoothSavitzkyGolay } from '@shared/analysis/smoothing';
import { ComparisonEngineError } from './errors';
import { bikeLabel, r3, r4, runName, standardLabel } from './labels';
import { runFileLabel } from '@shared/labels';
import { DEFAULT_BAND_WIDTH, type EngineRun, type Prepared } from './types';

const num = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);

/** Conditions used for correction: the run's own, then its session's for what the file lacked. */
export function conditionsOf(run: Pick<EngineRun, 'conditions' | 'session'>): ComparisonRunSummary['conditions'] {
  const c = (run.conditions ?? {}) as Record<string, unknown>;
  const s = run.session;
  return {
    temperatureC: num(c.temperatureC) ?? num(s?.ambientTempC),
    baroKpa: num(c.baroKpa) ?? num(s?.baroKpa),
    humidityPct: num(c.humidityPct) ?? num(s?.humidityPct),
  };
}

/** Keeps the samples inside an rpm range (no interpolation: used for peaks only). */
export function clip(c: NormalizedCurve, [lo, hi]: [number, number]): NormalizedCurve {
  const keep = c.rpm.map((r) => r >= lo && r <= hi);
  const pick = (v: number[]) => v.filter((_, i) => keep[i]);
  return { rpm: pick(c.rpm), torqueLbft: pick(c.torqueLbft), powerHp: pick(c.powerHp), afr: {} };
}

/**
 * Corrects (and optionally smooths) one run's stored uncorrected curve. With a chosen standard
 * the factor is recomputed from the run's conditions; when they are missing the stored factor is
 * kept and a warning says so. A run without an analysed curve is a RUN_NOT_READY error.
 */
export function prepare(run: EngineRun, options: ComparisonOptions): Prepared {
  const warnings: ComparisonWarning[] = [];
  const stored = run.curve;
  if (run.status !== 'ready' || !stored || stored.rpm.length < 2) {
    throw new ComparisonEngineError('RUN_NOT_READY', `Run “${runName(run)}” has no analysed curve yet; finish its column mapping or remove it from the comparison.`, { runId: run.id });
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
      fileName: run.file ? runFileLabel(run.file) : null,
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

/** One run against the baseline; no common range is an engine error naming both runs. */
export function compareOrThrow(base: Prepared, other: Prepared, options: ComparisonOptions): ComparisonFigures {
  try {
    return compareCurves(base.curve, other.curve, { bandWidthRpm: options.bandWidthRpm ?? DEFAULT_BAND_WIDTH, rpmRange: options.rpmRange });
  } catch (e) {
    if (isAnalysisError(e)) {
      throw new ComparisonEngineError(e.code, `“${other.summary.name}” and the baseline “${base.summary.name}”: ${e.message}`, { runIds: [base.run.id, other.run.id] });
    }
    throw e;
  }
}

/**
 * Every run's corrected curve on one rpm grid (the finest step among the runs, across the union
 * of their ranges cut to the rpm range), null outside a run's own range. hp and lb·ft.
 */
export function alignedCurves(all: Prepared[], options: ComparisonOptions): ComparisonPreview['curves'] {
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
