/**
 * The bay board's figures, pure: each pull corrected with its stored factor (the comparison
 * engine's `prepare`), its gain over the reference run (`compareCurves`), and the run-to-run
 * spread of the stage's pulls (`repeatability`), worded as "3 pulls within 0.8 hp".
 */
import { compareCurves, repeatability } from '@shared/analysis/compare';
import { isAnalysisError } from '@shared/analysis/errors';
import { prepare, type EngineRun, type Prepared } from '../comparisons/engine';
import { isComparisonEngineError } from '../comparisons/engine';

export interface BayPullFigures {
  runId: string;
  curve: { rpm: number[]; powerHp: number[]; torqueLbft: number[] } | null;
  peakPowerHp: number | null;
  peakTorqueLbft: number | null;
  gain: { peakPowerHp: number; peakTorqueLbft: number; averagePowerHp: number } | null;
}

const round = (v: number, places: number) => Math.round(v * 10 ** places) / 10 ** places;

function prepared(run: EngineRun): Prepared | null {
  try {
    return prepare(run, {});
  } catch (e) {
    if (isComparisonEngineError(e)) return null; // not readable yet (needs a mapping, failed)
    throw e;
  }
}

/** A pull's corrected curve and peaks, and its gain over `reference` (null for the reference itself or without a common range). */
export function pullFigures(run: EngineRun, reference: Prepared | null): BayPullFigures {
  const p = prepared(run);
  if (!p) return { runId: run.id, curve: null, peakPowerHp: null, peakTorqueLbft: null, gain: null };
  let gain: BayPullFigures['gain'] = null;
  if (reference && reference.run.id !== run.id) {
    try {
      const f = compareCurves(reference.curve, p.curve);
      gain = { peakPowerHp: round(f.peakPowerGain.hp, 2), peakTorqueLbft: round(f.peakTorqueGain.lbft, 2), averagePowerHp: round(f.averagePowerGainHp, 2) };
    } catch (e) {
      if (!isAnalysisError(e)) throw e;
    }
  }
  return {
    runId: run.id,
    curve: { rpm: p.curve.rpm, powerHp: p.curve.powerHp.map((v) => round(v, 3)), torqueLbft: p.curve.torqueLbft.map((v) => round(v, 3)) },
    peakPowerHp: p.summary.peakPower.hp,
    peakTorqueLbft: p.summary.peakTorque.lbft,
    gain,
  };
}

export const prepareReference = (run: EngineRun | null): Prepared | null => (run ? prepared(run) : null);

/** "3 pulls within 0.8 hp": how many pulls and the range of their peak power. */
export function spreadText(pulls: number, peakPowerSpreadHp: number): string {
  return `${pulls} pulls within ${peakPowerSpreadHp.toFixed(1)} hp`;
}

/** Spread of the readable pulls among `runs` (2 or more), or null. */
export function pullSpread(runs: EngineRun[]): { pulls: number; peakPowerSpreadHp: number; text: string } | null {
  const curves = runs.map(prepared).filter((p): p is Prepared => p !== null);
  if (curves.length < 2) return null;
  try {
    const rep = repeatability(curves.map((c) => c.curve));
    const spread = round(rep.peakPowerSpreadHp, 2);
    return { pulls: rep.runs, peakPowerSpreadHp: spread, text: spreadText(rep.runs, spread) };
  } catch (e) {
    if (isAnalysisError(e)) return null;
    throw e;
  }
}
