/**
 * Resampling to a regular rpm grid. Samples are averaged per grid bin (dense logs) and the bin
 * means are then linearly interpolated at the grid points (sparse logs), so both a 1 kHz logger
 * and a 100-rpm-step export give the same kind of curve. Order of samples does not matter.
 */

/** Grid points that fit inside [lo, hi]: whole multiples of `step`. */
export function gridPoints(lo: number, hi: number, step: number): number[] {
  const first = Math.ceil(lo / step - 1e-9);
  const last = Math.floor(hi / step + 1e-9);
  const out: number[] = [];
  for (let k = first; k <= last; k++) out.push(k * step);
  return out;
}

/** Linear interpolation of sorted (x, y) at `at` (clamped linear extrapolation of the end segments). */
export function interpolateSorted(x: ArrayLike<number>, y: ArrayLike<number>, at: number[]): number[] {
  const n = x.length;
  const out = new Array<number>(at.length);
  if (n === 0) return out.fill(NaN);
  if (n === 1) return out.fill(y[0]);
  let j = 0;
  for (let i = 0; i < at.length; i++) {
    const g = at[i];
    while (j < n - 2 && x[j + 1] < g) j++;
    const x0 = x[j];
    const x1 = x[j + 1];
    const t = x1 === x0 ? 0 : (g - x0) / (x1 - x0);
    out[i] = y[j] + t * (y[j + 1] - y[j]);
  }
  return out;
}

/**
 * Resamples several series sampled at `rpm` onto the grid of `step` rpm. NaN samples are ignored
 * per series. Returns the grid and the resampled series (NaN where a series has no data at all).
 */
export function resampleToGrid(rpm: ArrayLike<number>, series: ArrayLike<number>[], step: number): { grid: number[]; values: number[][] } {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < rpm.length; i++) {
    if (rpm[i] < lo) lo = rpm[i];
    if (rpm[i] > hi) hi = rpm[i];
  }
  const grid = gridPoints(lo, hi, step);
  const k0 = Math.round(lo / step);
  const bins = Math.round(hi / step) - k0 + 1;
  const values = series.map((ys) => {
    const sumX = new Float64Array(bins);
    const sumY = new Float64Array(bins);
    const count = new Uint32Array(bins);
    for (let i = 0; i < rpm.length; i++) {
      const y = ys[i];
      if (Number.isNaN(y)) continue;
      const b = Math.round(rpm[i] / step) - k0;
      sumX[b] += rpm[i];
      sumY[b] += y;
      count[b]++;
    }
    const xs: number[] = [];
    const ms: number[] = [];
    for (let b = 0; b < bins; b++) {
      if (count[b] === 0) continue;
      xs.push(sumX[b] / count[b]);
      ms.push(sumY[b] / count[b]);
    }
    return interpolateSorted(xs, ms, grid);
  });
  return { grid, values };
}
