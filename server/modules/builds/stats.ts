/**
 * Sample quantiles by linear interpolation between order statistics — Hyndman & Fan (1996)
 * definition 7, R's default `quantile(type = 7)`, NumPy's default "linear" method and what
 * PostgreSQL's percentile_cont computes: h = (n − 1)·p, Q(p) = x[⌊h⌋] + (h − ⌊h⌋)·(x[⌊h⌋+1] − x[⌊h⌋]).
 */
export const QUANTILE_METHOD = 'Hyndman & Fan type 7 (R-7): linear interpolation between order statistics, h = (n − 1)·p';

export function quantileR7(sorted: readonly number[], p: number): number {
  if (!sorted.length) throw new Error('quantile of an empty sample');
  if (p < 0 || p > 1) throw new Error('p must be within 0…1');
  const h = (sorted.length - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, sorted.length - 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

export interface FiveNumbers {
  min: number;
  q1: number;
  median: number;
  q3: number;
  max: number;
}

/** min, first quartile, median, third quartile, max; null for an empty sample. */
export function fiveNumbers(values: readonly number[]): FiveNumbers | null {
  const xs = values.filter((v) => Number.isFinite(v)).slice().sort((a, b) => a - b);
  if (!xs.length) return null;
  return { min: xs[0], q1: quantileR7(xs, 0.25), median: quantileR7(xs, 0.5), q3: quantileR7(xs, 0.75), max: xs[xs.length - 1] };
}
