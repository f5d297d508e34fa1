/**
 * The comparison engine's entry point: runs (plain data) in, a whole comparison out — each run
 * corrected, compared against the baseline over the common range, with fairness warnings, the
 * run-to-run spread of every stage involved that has 2+ ready runs, colour slots and plain sentences.
 * Pure: no database, no HTTP; bad input is a {@link ComparisonEngineError}.
 */
import type { ComparisonOptions, ComparisonPreview, ComparisonResult } from '@shared/schemas/comparison';
import { type ArchiveRun, runColorSlots } from '../run-colors';
import { ComparisonEngineError } from './errors';
import { fairnessWarnings } from './fairness';
import { r3, r4 } from './labels';
import { alignedCurves, compareOrThrow, prepare } from './prepare';
import { describeResult, summarySentences } from './sentences';
import { bandKey, maxKnown, stageSpreads, within } from './spread';
import { DEFAULT_BAND_WIDTH, type EngineRun, type Prepared } from './types';

export interface ComparisonRequest {
  /** The compared runs in display order (baseline among them). */
  runIds: string[];
  baselineRunId: string;
  options: ComparisonOptions;
  /**
   * Colour slots to keep (a saved comparison's). Used only when every run has one; otherwise
   * (comparisons saved before slots were kept) all colours come from the archive.
   */
  colorSlots?: Record<string, number> | null;
}

/** Colour slots of the compared runs from their bikes' archives (run-colors.ts); `rows` hold every visible run of those bikes. */
function colorSlotsOf(rows: EngineRun[], all: Prepared[]): Map<string, number> {
  const bikeIds = new Set(all.map((p) => p.run.bike.id));
  const archive: ArchiveRun[] = rows
    .filter((r) => bikeIds.has(r.bike.id))
    .map((r) => ({ id: r.id, bikeId: r.bike.id, stagePosition: r.stage?.position ?? null, sequence: r.sequence, createdAt: r.createdAt }));
  return runColorSlots(archive, all.map((p) => p.run.id));
}

/**
 * Computes a comparison. `rows` hold the compared runs and, newest first, every other run the
 * spread and the colours look at (the compared runs' bikes' archives, their stages' ready runs).
 */
export function computeComparison(rows: EngineRun[], request: ComparisonRequest): ComparisonPreview {
  const { options } = request;
  const byId = new Map(rows.map((r) => [r.id, r]));
  const missing = request.runIds.filter((id) => !byId.has(id));
  if (missing.length) throw new ComparisonEngineError('NOT_FOUND', 'Run not found', { runIds: missing });
  if (!request.runIds.includes(request.baselineRunId)) throw new ComparisonEngineError('VALIDATION_FAILED', 'The baseline must be one of the compared runs', { baselineRunId: request.baselineRunId });
  const all = request.runIds.map((id) => prepare(byId.get(id)!, options));
  const baseline = all.find((p) => p.run.id === request.baselineRunId)!;
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
        const key = bandKey(b.from, width);
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

  const nameOf = (runId: string) => all.find((p) => p.run.id === runId)!.summary.name;
  const summary = summarySentences(results, nameOf, baseline.summary.name, spreads.size > 0, warnings);

  const kept = request.colorSlots ?? {};
  const colors = request.runIds.every((id) => Number.isInteger(kept[id])) ? new Map(Object.entries(kept)) : colorSlotsOf(rows, all);
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
