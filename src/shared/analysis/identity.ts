/**
 * Cross-check: power must equal torque × rpm ÷ 5252.113 (hp, lb·ft). On a mismatch the usual
 * mix-ups are tested — power really in kW or PS, torque really in N·m or kgf·m, the speed column
 * not engine rpm — and the one that explains the data is named (and applied only when it alone
 * fits clearly).
 */
import { HP_TORQUE_CONSTANT, type PowerUnit, type TorqueUnit, powerToHp, torqueToLbft } from './units.js';

/** Median deviation within which power and torque agree (issue 3: 1.5 %). */
export const IDENTITY_TOLERANCE_PCT = 1.5;

/** Per-point deviation statistics of power vs torque × rpm. */
export interface IdentityStats {
  medianDeviationPct: number;
  maxDeviationPct: number;
}

/** Median of a numeric array (NaN for empty). */
export function median(values: number[]): number {
  if (values.length === 0) return NaN;
  const s = Float64Array.from(values).sort();
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** Indices used for the check: points with power above 5 % of the sweep's maximum (avoids 0/0 at the ends). Subsampled to ≤ 20 000. */
function checkIndices(powerHp: ArrayLike<number>, n: number): number[] {
  let maxP = 0;
  for (let i = 0; i < n; i++) if (powerHp[i] > maxP) maxP = powerHp[i];
  const stride = Math.max(1, Math.floor(n / 20_000));
  const out: number[] = [];
  for (let i = 0; i < n; i += stride) if (powerHp[i] > 0.05 * maxP) out.push(i);
  return out;
}

/** Deviation of power from torque × rpm / 5252.113, in % of power, with scale factors applied. */
export function identityStats(
  rpm: ArrayLike<number>,
  torqueLbft: ArrayLike<number>,
  powerHp: ArrayLike<number>,
  scale: { torque?: number; power?: number; rpm?: number } = {},
): IdentityStats {
  const sT = scale.torque ?? 1;
  const sP = scale.power ?? 1;
  const sR = scale.rpm ?? 1;
  const idx = checkIndices(powerHp, rpm.length);
  const devs: number[] = [];
  let max = 0;
  for (const i of idx) {
    const p = powerHp[i] * sP;
    const expected = (torqueLbft[i] * sT * rpm[i] * sR) / HP_TORQUE_CONSTANT;
    const d = (Math.abs(p - expected) / Math.abs(p)) * 100;
    devs.push(d);
    if (d > max) max = d;
  }
  if (devs.length === 0) return { medianDeviationPct: 0, maxDeviationPct: 0 };
  return { medianDeviationPct: median(devs), maxDeviationPct: max };
}

/** Outcome of the mix-up search. */
export interface Diagnosis {
  /** Units that explain the data, when exactly one combination does. */
  units?: { torque: TorqueUnit; power: PowerUnit };
  /** Engine rpm ≈ column × factor, when the speed column looks proportional to, but not, engine rpm. */
  rpmFactor?: number;
  /** All explanations that fit. */
  fits: { torque: TorqueUnit; power: PowerUnit; medianDeviationPct: number }[];
}

const TORQUE_UNITS: TorqueUnit[] = ['lbft', 'nm', 'kgfm'];
const POWER_UNITS: PowerUnit[] = ['hp', 'kw', 'ps'];

/**
 * Tests unit mix-ups against the declared units. `torqueLbft`/`powerHp` were converted with the
 * declared units; each alternative is a pure rescale.
 */
export function diagnoseMismatch(
  rpm: ArrayLike<number>,
  torqueLbft: ArrayLike<number>,
  powerHp: ArrayLike<number>,
  declared: { torque: TorqueUnit; power: PowerUnit },
): Diagnosis {
  const fits: Diagnosis['fits'] = [];
  for (const tu of TORQUE_UNITS) {
    for (const pu of POWER_UNITS) {
      if (tu === declared.torque && pu === declared.power) continue;
      const sT = torqueToLbft(1, tu) / torqueToLbft(1, declared.torque);
      const sP = powerToHp(1, pu) / powerToHp(1, declared.power);
      const s = identityStats(rpm, torqueLbft, powerHp, { torque: sT, power: sP });
      if (s.medianDeviationPct <= IDENTITY_TOLERANCE_PCT) fits.push({ torque: tu, power: pu, medianDeviationPct: s.medianDeviationPct });
    }
  }
  fits.sort((a, b) => a.medianDeviationPct - b.medianDeviationPct);
  const out: Diagnosis = { fits };
  if (fits.length === 1 || (fits.length > 1 && fits[0].medianDeviationPct < 0.3 * fits[1].medianDeviationPct)) {
    out.units = { torque: fits[0].torque, power: fits[0].power };
  }
  if (fits.length === 0) {
    // Ratio power / (torque × rpm / 5252): constant but ≠ 1 means the speed column is proportional to engine speed.
    const idx = checkIndices(powerHp, rpm.length);
    const ratios = idx.filter((i) => torqueLbft[i] > 0 && rpm[i] > 0).map((i) => (powerHp[i] * HP_TORQUE_CONSTANT) / (torqueLbft[i] * rpm[i]));
    const k = median(ratios);
    if (Number.isFinite(k) && ratios.length >= 5) {
      const spread = median(ratios.map((r) => Math.abs(r - k) / k)) * 100;
      if (spread <= IDENTITY_TOLERANCE_PCT) out.rpmFactor = k;
    }
  }
  return out;
}
