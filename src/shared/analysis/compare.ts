/**
 * Comparison of normalised runs: common range, peak gains, area under the power curve, average
 * and per-band gains, largest gain and loss, and repeatability of several runs of one stage.
 * Browser-safe. Curves should already carry the same correction standard.
 */
import { type NormalizedCurve, peaksOf } from './curve.js';
import { AnalysisError } from './errors.js';
import { gridPoints, interpolateSorted } from './resample.js';

/** Options of {@link compareCurves}. */
export interface CompareOptions {
  /** Width of the rpm bands (default 1000); bands are aligned to whole multiples of it. */
  bandWidthRpm?: number;
  /** Restrict the comparison (and the peaks) to this rpm range. */
  rpmRange?: [number, number];
}

/** Figures comparing one run against a baseline. Gains are other − baseline. */
export interface ComparisonFigures {
  commonRpm: [number, number];
  peakPowerGain: { hp: number; pct: number };
  peakTorqueGain: { lbft: number; pct: number };
  peakPowerRpmShift: number;
  peakTorqueRpmShift: number;
  /** Gain in area under the power curve over the common range, % of the baseline's area. */
  areaGainPct: number;
  /** ∫Δhp d rpm ÷ width of the common range. */
  averagePowerGainHp: number;
  averageTorqueGainLbft: number;
  bands: { from: number; to: number; averagePowerGainHp: number; averageTorqueGainLbft: number }[];
  /** Largest Δhp on the common grid. */
  largestGain: { rpm: number; hp: number };
  /**
   * The rpm of the smallest change: the minimum Δhp on the common grid. When the run lost power
   * somewhere, hp < 0 is the largest loss; hp > 0 means no loss anywhere (it is then the smallest
   * gain, and hp = 0 means no change at that rpm). The shape `{rpm, hp}` is kept for API consumers.
   */
  largestLoss: { rpm: number; hp: number };
  /** Point-wise run − baseline on the common grid (for the difference chart). */
  delta: { rpm: number[]; powerHp: number[]; torqueLbft: number[] };
}

function gridStep(curve: NormalizedCurve): number {
  return curve.rpm.length >= 2 ? curve.rpm[1] - curve.rpm[0] : 50;
}

/** Trapezoidal ∫ y dx of sorted samples between a and b (linear interpolation at the limits). */
export function integrate(x: number[], y: number[], a: number, b: number): number {
  if (b <= a) return 0;
  const xs: number[] = [a];
  for (const v of x) if (v > a && v < b) xs.push(v);
  xs.push(b);
  const ys = interpolateSorted(x, y, xs);
  let s = 0;
  for (let i = 1; i < xs.length; i++) s += ((ys[i] + ys[i - 1]) / 2) * (xs[i] - xs[i - 1]);
  return s;
}

/** Common rpm range of several curves (optionally clipped); throws NO_COMMON_RANGE. */
export function commonRange(curves: NormalizedCurve[], clip?: [number, number]): [number, number] {
  let lo = -Infinity;
  let hi = Infinity;
  for (const c of curves) {
    if (c.rpm.length < 2) throw new AnalysisError('NO_COMMON_RANGE', 'A run has fewer than two points.');
    lo = Math.max(lo, c.rpm[0]);
    hi = Math.min(hi, c.rpm[c.rpm.length - 1]);
  }
  if (clip) {
    lo = Math.max(lo, Math.min(clip[0], clip[1]));
    hi = Math.min(hi, Math.max(clip[0], clip[1]));
  }
  if (!(hi > lo)) throw new AnalysisError('NO_COMMON_RANGE', 'The runs do not share an rpm range.');
  return [lo, hi];
}

function within(curve: NormalizedCurve, lo: number, hi: number): NormalizedCurve {
  const keep = curve.rpm.map((r) => r >= lo && r <= hi);
  const pick = (v: number[]) => v.filter((_, i) => keep[i]);
  return { rpm: pick(curve.rpm), torqueLbft: pick(curve.torqueLbft), powerHp: pick(curve.powerHp), afr: {} };
}

/**
 * Compares `other` against `baseline`. Peaks are each run's own peaks (within `rpmRange` when
 * given), as the customer sees them on each sheet; area, averages, bands and the largest gain or
 * loss use the common range. Throws `NO_COMMON_RANGE`.
 */
export function compareCurves(baseline: NormalizedCurve, other: NormalizedCurve, options: CompareOptions = {}): ComparisonFigures {
  const width = options.bandWidthRpm ?? 1000;
  if (!(width > 0)) throw new AnalysisError('INVALID_OPTION', 'The band width must be a positive number of rpm.');
  const [lo, hi] = commonRange([baseline, other], options.rpmRange);
  const step = Math.min(gridStep(baseline), gridStep(other));
  const grid = gridPoints(lo, hi, step);
  if (grid[0] !== lo) grid.unshift(lo);
  if (grid[grid.length - 1] !== hi) grid.push(hi);
  const bp = interpolateSorted(baseline.rpm, baseline.powerHp, grid);
  const op = interpolateSorted(other.rpm, other.powerHp, grid);
  const bt = interpolateSorted(baseline.rpm, baseline.torqueLbft, grid);
  const ot = interpolateSorted(other.rpm, other.torqueLbft, grid);
  const dP = grid.map((_, i) => op[i] - bp[i]);
  const dT = grid.map((_, i) => ot[i] - bt[i]);

  const scope = options.rpmRange ? (c: NormalizedCurve) => within(c, lo, hi) : (c: NormalizedCurve) => c;
  const pb = peaksOf(scope(baseline));
  const po = peaksOf(scope(other));
  const areaBase = integrate(grid, bp, lo, hi);
  const areaOther = integrate(grid, op, lo, hi);

  const bands: ComparisonFigures['bands'] = [];
  for (let from = Math.floor(lo / width) * width; from < hi; from += width) {
    const a = Math.max(from, lo);
    const b = Math.min(from + width, hi);
    if (b <= a) continue;
    bands.push({
      from: a,
      to: b,
      averagePowerGainHp: integrate(grid, dP, a, b) / (b - a),
      averageTorqueGainLbft: integrate(grid, dT, a, b) / (b - a),
    });
  }
  let gi = 0;
  let li = 0;
  for (let i = 1; i < grid.length; i++) {
    if (dP[i] > dP[gi]) gi = i;
    if (dP[i] < dP[li]) li = i;
  }
  return {
    commonRpm: [lo, hi],
    peakPowerGain: { hp: po.peakPower.hp - pb.peakPower.hp, pct: ((po.peakPower.hp - pb.peakPower.hp) / pb.peakPower.hp) * 100 },
    peakTorqueGain: {
      lbft: po.peakTorque.lbft - pb.peakTorque.lbft,
      pct: ((po.peakTorque.lbft - pb.peakTorque.lbft) / pb.peakTorque.lbft) * 100,
    },
    peakPowerRpmShift: po.peakPower.rpm - pb.peakPower.rpm,
    peakTorqueRpmShift: po.peakTorque.rpm - pb.peakTorque.rpm,
    areaGainPct: ((areaOther - areaBase) / areaBase) * 100,
    averagePowerGainHp: integrate(grid, dP, lo, hi) / (hi - lo),
    averageTorqueGainLbft: integrate(grid, dT, lo, hi) / (hi - lo),
    bands,
    largestGain: { rpm: grid[gi], hp: dP[gi] },
    largestLoss: { rpm: grid[li], hp: dP[li] },
    delta: { rpm: grid, powerHp: dP, torqueLbft: dT },
  };
}

/** Repeatability of several runs of one stage. */
export interface Repeatability {
  runs: number;
  /** Max − min of the runs' peak power. */
  peakPowerSpreadHp: number;
  peakTorqueSpreadLbft: number;
  /** Point-wise mean over the common range. */
  meanCurve: NormalizedCurve;
  /** Largest |run − mean| power over the common range, and where. */
  largestDeviationHp: number;
  largestDeviationRpm: number;
}

/** Repeatability of several runs of one stage (needs at least one; throws NO_COMMON_RANGE). */
export function repeatability(curves: NormalizedCurve[]): Repeatability {
  if (curves.length === 0) throw new AnalysisError('NO_COMMON_RANGE', 'No runs were given.');
  const [lo, hi] = commonRange(curves);
  const step = Math.min(...curves.map(gridStep));
  const grid = gridPoints(lo, hi, step);
  if (grid.length === 0 || grid[0] !== lo) grid.unshift(lo);
  if (grid[grid.length - 1] !== hi) grid.push(hi);
  const powers = curves.map((c) => interpolateSorted(c.rpm, c.powerHp, grid));
  const torques = curves.map((c) => interpolateSorted(c.rpm, c.torqueLbft, grid));
  const mean = (series: number[][]) => grid.map((_, i) => series.reduce((s, v) => s + v[i], 0) / series.length);
  const meanP = mean(powers);
  const meanT = mean(torques);
  let dev = 0;
  let devRpm = grid[0];
  for (const p of powers) {
    for (let i = 0; i < grid.length; i++) {
      const d = Math.abs(p[i] - meanP[i]);
      if (d > dev) {
        dev = d;
        devRpm = grid[i];
      }
    }
  }
  const peaks = curves.map(peaksOf);
  const hp = peaks.map((p) => p.peakPower.hp);
  const tq = peaks.map((p) => p.peakTorque.lbft);
  return {
    runs: curves.length,
    peakPowerSpreadHp: Math.max(...hp) - Math.min(...hp),
    peakTorqueSpreadLbft: Math.max(...tq) - Math.min(...tq),
    meanCurve: { rpm: grid, torqueLbft: meanT, powerHp: meanP, afr: {} },
    largestDeviationHp: dev,
    largestDeviationRpm: devRpm,
  };
}
