/**
 * One value scale for power and torque on the same chart.
 *
 * In hp and lb·ft, hp = lb·ft × rpm / 5252.113 (1 hp = 550 ft·lbf/s, so the constant is 33 000 / 2π;
 * NIST SP 811), so the two curves have equal values — and cross — at 5,252 rpm. In kW and N·m the
 * constant is 60 000 / 2π ≈ 9549.297, so they cross at 9,549 rpm. That crossing is only visible when
 * both curves are drawn on one scale: two independently scaled y axes move it anywhere. Charts that
 * show power and torque together use {@link sharedPowerTorqueRange} for both axes (same min and max)
 * when {@link powerTorqueCrossRpm} says the unit pair has a crossing.
 *
 * Pure and browser-safe (used by the client charts and the server PDF).
 */

/** Engine speed where hp equals lb·ft: 33 000 / 2π ≈ 5252.113 rpm. */
export const HP_LBFT_CROSS_RPM = 33_000 / (2 * Math.PI);
/** Engine speed where kW equals N·m: 60 000 / 2π ≈ 9549.297 rpm. */
export const KW_NM_CROSS_RPM = 60_000 / (2 * Math.PI);

/**
 * The rpm where power and torque curves cross for a unit pair, or null when the pair has no
 * fixed crossing we promise to show (mixed pairs such as hp with N·m, or PS).
 */
export function powerTorqueCrossRpm(powerUnit: string, torqueUnit: string): number | null {
  if (powerUnit === 'hp' && torqueUnit === 'lbft') return HP_LBFT_CROSS_RPM;
  if (powerUnit === 'kw' && torqueUnit === 'nm') return KW_NM_CROSS_RPM;
  return null;
}

/**
 * A "nice" step for an axis spanning `span` with about `targetTicks` intervals: 1, 2, 2.5 or 5 × 10^k.
 */
export function niceStep(span: number, targetTicks = 5): number {
  if (!Number.isFinite(span) || span <= 0) return 1;
  const raw = span / Math.max(1, targetTicks);
  const magnitude = 10 ** Math.floor(Math.log10(raw));
  const fraction = raw / magnitude;
  const nice = fraction <= 1 ? 1 : fraction <= 2 ? 2 : fraction <= 2.5 ? 2.5 : fraction <= 5 ? 5 : 10;
  const step = nice * magnitude;
  return step > 0 && Number.isFinite(step) ? step : 1;
}

function finiteOr(v: number | undefined, fallback: number): number {
  return v !== undefined && Number.isFinite(v) ? v : fallback;
}

/**
 * One [min, max] for both the power and the torque axis, with nice rounded bounds (multiples of a
 * 1/2/2.5/5 × 10^k step). The range covers every value of both curves; the lower bound is 0 unless a
 * curve goes below 0 (minPower / minTorque default to 0). Non-finite inputs are ignored; with no
 * usable values the range is 0–1.
 */
export function sharedPowerTorqueRange(
  maxPower: number,
  maxTorque: number,
  minPower?: number,
  minTorque?: number,
): { min: number; max: number } {
  const hi = Math.max(finiteOr(maxPower, 0), finiteOr(maxTorque, 0), 0);
  const lo = Math.min(finiteOr(minPower, 0), finiteOr(minTorque, 0), 0);
  if (hi - lo <= 0) return { min: 0, max: 1 };
  const step = niceStep(hi - lo);
  let min = Math.floor(lo / step) * step;
  let max = Math.ceil(hi / step) * step;
  if (min > lo) min -= step; // floating-point rounding at the edges
  if (max < hi) max += step;
  return { min: min === 0 ? 0 : min, max };
}
