/**
 * The normalised curve shared by analysis, comparison, the client and the PDF. Browser-safe.
 */

/**
 * A resampled sweep on a regular rpm grid, UNCORRECTED (so any correction standard can be applied
 * later with {@link applyCorrection}). Always hp and lb·ft.
 */
export interface NormalizedCurve {
  rpm: number[];
  torqueLbft: number[];
  powerHp: number[];
  /**
   * Mixture channels on the same grid, keyed by the column's header text. Channels logged as
   * lambda are converted to AFR (lambda × 14.7, gasoline) and keyed `"<header> (AFR)"`; channels
   * already in AFR keep their header as the key.
   */
  afr: Record<string, number[]>;
}

/** Peak power and peak torque of a curve and the rpm where they occur. */
export interface Peaks {
  peakPower: { hp: number; rpm: number };
  peakTorque: { lbft: number; rpm: number };
}

/** Reads the peaks of a curve (first occurrence of the maximum). */
export function peaksOf(curve: NormalizedCurve): Peaks {
  let pi = 0;
  let ti = 0;
  for (let i = 1; i < curve.rpm.length; i++) {
    if (curve.powerHp[i] > curve.powerHp[pi]) pi = i;
    if (curve.torqueLbft[i] > curve.torqueLbft[ti]) ti = i;
  }
  return {
    peakPower: { hp: curve.powerHp[pi] ?? NaN, rpm: curve.rpm[pi] ?? NaN },
    peakTorque: { lbft: curve.torqueLbft[ti] ?? NaN, rpm: curve.rpm[ti] ?? NaN },
  };
}

/** Multiplies power and torque by a correction factor (AFR and rpm unchanged). Returns a new curve. */
export function applyCorrection(curve: NormalizedCurve, factor: number): NormalizedCurve {
  return {
    rpm: [...curve.rpm],
    torqueLbft: curve.torqueLbft.map((v) => v * factor),
    powerHp: curve.powerHp.map((v) => v * factor),
    afr: Object.fromEntries(Object.entries(curve.afr).map(([k, v]) => [k, [...v]])),
  };
}
