import { formatGain, formatNumber, formatPercentChange } from '@shared/format';
import type { Units } from '../api/types';

/** 1 hp = 745.6999 W and 1 lbf·ft = 1.355818 N·m (NIST SP 811), as the PDF uses. */
const KW_PER_HP = 0.7456999;
const NM_PER_LBFT = 1.355818;

export function displayUnits(units: Units) {
  const metric = units === 'metric';
  return {
    power: metric ? 'kW' : 'hp',
    torque: metric ? 'N·m' : 'lb·ft',
    p: (hp: number) => (metric ? hp * KW_PER_HP : hp),
    t: (lbft: number) => (metric ? lbft * NM_PER_LBFT : lbft),
  };
}
export type DisplayUnits = ReturnType<typeof displayUnits>;

export const powerGain = (u: DisplayUnits, hp: number) => formatGain(u.p(hp), u.power, 1);
export const torqueGain = (u: DisplayUnits, lbft: number) => formatGain(u.t(lbft), u.torque, 1);
export const powerValue = (u: DisplayUnits, hp: number) => `${formatNumber(u.p(hp), { decimals: 1 })} ${u.power}`;
export const torqueValue = (u: DisplayUnits, lbft: number) => `${formatNumber(u.t(lbft), { decimals: 1 })} ${u.torque}`;
export const pctChange = (pct: number) => formatPercentChange(pct / 100, 1);
