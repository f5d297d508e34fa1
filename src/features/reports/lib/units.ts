import { formatGain, formatNumber, formatPercentChange } from '@shared/format';
import { hpTo, lbftTo } from '@shared/analysis/units';
import type { Units } from '../api/types';

/** The shop's units for display; conversions from the analysis module (NIST SP 811 factors), as the PDF uses. */
export function displayUnits(units: Units) {
  const metric = units === 'metric';
  return {
    power: metric ? 'kW' : 'hp',
    torque: metric ? 'N·m' : 'lb·ft',
    p: (hp: number) => (metric ? hpTo(hp, 'kw') : hp),
    t: (lbft: number) => (metric ? lbftTo(lbft, 'nm') : lbft),
  };
}
export type DisplayUnits = ReturnType<typeof displayUnits>;

export const powerGain = (u: DisplayUnits, hp: number) => formatGain(u.p(hp), u.power, 1);
export const torqueGain = (u: DisplayUnits, lbft: number) => formatGain(u.t(lbft), u.torque, 1);
export const powerValue = (u: DisplayUnits, hp: number) => `${formatNumber(u.p(hp), { decimals: 1 })} ${u.power}`;
export const torqueValue = (u: DisplayUnits, lbft: number) => `${formatNumber(u.t(lbft), { decimals: 1 })} ${u.torque}`;
export const pctChange = (pct: number) => formatPercentChange(pct / 100, 1);
