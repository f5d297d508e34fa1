/**
 * Difference from the baseline, rpm by rpm, for the report's second chart (screen and PDF). The
 * report's curves come from one shared rpm grid (a run leaves out the points it has no figure
 * for), so the difference is taken only where both the run and the baseline have a point.
 */

/** One run's corrected curve, power in hp and torque in lb·ft (the report's stored shape). */
export interface CurveLike {
  runId: string;
  rpm: readonly number[];
  powerHp: readonly number[];
  torqueLbft: readonly number[];
}

export interface DifferenceCurve {
  runId: string;
  rpm: number[];
  /** Run minus baseline, hp. */
  powerHp: number[];
  /** Run minus baseline, lb·ft. */
  torqueLbft: number[];
}

/** Each run other than the baseline, minus the baseline at the rpm both have; [] without a baseline curve. */
export function differenceFromBaseline(curves: readonly CurveLike[], baselineRunId: string): DifferenceCurve[] {
  const base = curves.find((c) => c.runId === baselineRunId);
  if (!base) return [];
  const at = new Map(base.rpm.map((r, i) => [r, i]));
  return curves
    .filter((c) => c.runId !== baselineRunId)
    .map((c) => {
      const out: DifferenceCurve = { runId: c.runId, rpm: [], powerHp: [], torqueLbft: [] };
      c.rpm.forEach((r, i) => {
        const j = at.get(r);
        if (j === undefined) return;
        out.rpm.push(r);
        out.powerHp.push(c.powerHp[i] - base.powerHp[j]);
        out.torqueLbft.push(c.torqueLbft[i] - base.torqueLbft[j]);
      });
      return out;
    })
    .filter((d) => d.rpm.length > 1);
}

/** Lowest and highest of every difference (power and torque, in display units), 0 always included. */
export function differenceRange(diffs: readonly DifferenceCurve[], p: (hp: number) => number, t: (lbft: number) => number): { min: number; max: number } {
  let min = 0;
  let max = 0;
  for (const d of diffs) {
    for (const v of d.powerHp) {
      min = Math.min(min, p(v));
      max = Math.max(max, p(v));
    }
    for (const v of d.torqueLbft) {
      min = Math.min(min, t(v));
      max = Math.max(max, t(v));
    }
  }
  return { min, max };
}
