/**
 * Run-to-run spread (repeatability): how far a stage's own runs differ from each other, overall and
 * per rpm band. A gain no larger than the spread is "within run-to-run spread".
 */
import type { ComparisonOptions, StageRepeatability } from '@shared/schemas/comparison';
import { type ComparisonFigures, compareCurves, repeatability } from '@shared/analysis/compare';
import { isAnalysisError } from '@shared/analysis/errors';
import { r4 } from './labels';
import { prepare } from './prepare';
import { DEFAULT_BAND_WIDTH, MAX_STAGE_RUNS, type EngineRun, type Prepared } from './types';

export interface StageSpread {
  info: StageRepeatability;
  /** Band spread keyed by the band's aligned start rpm. */
  bands: Map<number, number>;
}

/** The larger of two known spreads (null when neither is known). */
export function maxKnown(a: number | null | undefined, b: number | null | undefined): number | null {
  const known = [a, b].filter((v): v is number => typeof v === 'number');
  return known.length ? Math.max(...known) : null;
}

/** Whether a gain is no larger than the spread (null when the spread is unknown). */
export const within = (gain: number, spread: number | null) => (spread === null ? null : Math.abs(gain) <= spread);

/** Start rpm of the band of width `width` that `from` falls in (bands of different runs line up on it). */
export const bandKey = (from: number, width: number) => Math.floor(from / width) * width;

/**
 * Run-to-run spread of each stage with 2+ ready runs. `runs` are the candidate runs, newest first;
 * the newest {@link MAX_STAGE_RUNS} ready runs of a stage count. Runs already prepared with the same
 * options (`known`) are reused. The average-power spread is the range of each run's average power
 * gain over the stage's newest run (which counts as 0); band spreads likewise per band.
 */
export function stageSpreads(runs: EngineRun[], stageIds: string[], options: ComparisonOptions, known: Map<string, Prepared>): Map<string, StageSpread> {
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
        const key = bandKey(b.from, width);
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
