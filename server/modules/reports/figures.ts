/**
 * How the report prints its figures, in the shop's units. The PDF, the share page data and the
 * tests all format through these, so the printed text can be checked against the API's numbers.
 */
import { NM_PER_LBFT, W_PER_HP } from '@shared/analysis/units';
import { formatGain, formatMoney, formatNumber, formatPercentChange, formatRpm } from '@shared/format';
import type { UnitSystem } from '../shops/shop.entity';

export interface UnitLabels {
  power: 'hp' | 'kW';
  torque: 'lb·ft' | 'N·m';
}

export const unitLabels = (units: UnitSystem): UnitLabels => (units === 'metric' ? { power: 'kW', torque: 'N·m' } : { power: 'hp', torque: 'lb·ft' });

/** hp → the shop's power unit (1 hp = 745.6999 W, NIST SP 811). */
export const powerIn = (hp: number, units: UnitSystem) => (units === 'metric' ? (hp * W_PER_HP) / 1000 : hp);
/** lb·ft → the shop's torque unit (1 lbf·ft = 1.355818 N·m, NIST SP 811). */
export const torqueIn = (lbft: number, units: UnitSystem) => (units === 'metric' ? lbft * NM_PER_LBFT : lbft);

export const fmtPower = (hp: number, units: UnitSystem) => `${formatNumber(powerIn(hp, units), { decimals: 1 })} ${unitLabels(units).power}`;
export const fmtTorque = (lbft: number, units: UnitSystem) => `${formatNumber(torqueIn(lbft, units), { decimals: 1 })} ${unitLabels(units).torque}`;
export const fmtPowerGain = (hp: number, units: UnitSystem) => formatGain(powerIn(hp, units), unitLabels(units).power, 1);
export const fmtTorqueGain = (lbft: number, units: UnitSystem) => formatGain(torqueIn(lbft, units), unitLabels(units).torque, 1);
/** A percentage given as a percentage (5.4 → "+5.4%"). */
export const fmtPctChange = (pct: number) => formatPercentChange(pct / 100, 1);
export const fmtRpm = (rpm: number) => formatRpm(rpm);
export const fmtMoneyCents = (cents: number) => formatMoney(cents, { minorUnits: true });

/** Cost per unit of peak power gained; null when there was no gain. */
export function costPerPower(totalCostCents: number, gainHp: number, units: UnitSystem): string | null {
  const gain = powerIn(gainHp, units);
  if (!(gain > 0) || !(totalCostCents > 0)) return null;
  return `${formatMoney(totalCostCents / 100 / gain, { wholeUnits: true })} per ${unitLabels(units).power}`;
}

/**
 * What was done to the printed figures, in plain words, from each run's correction standard
 * ('none' = printed as measured) and its label: "Uncorrected (as measured)", "Corrected to SAE
 * J1349", or, when the runs differ, "Each run corrected to its own standard: SAE J1349, DIN 70020".
 */
export function correctionHeadline(runs: readonly { correctionStandard: string; correctionLabel: string }[]): string {
  const ids = [...new Set(runs.map((r) => r.correctionStandard))];
  const labelOf = (id: string) => runs.find((r) => r.correctionStandard === id)?.correctionLabel ?? id;
  if (!ids.length || (ids.length === 1 && ids[0] === 'none')) return 'Uncorrected (as measured)';
  if (ids.length === 1) return `Corrected to ${labelOf(ids[0])}`;
  const names = ids.map((id) => (id === 'none' ? 'uncorrected (as measured)' : labelOf(id)));
  return `Each run corrected to its own standard: ${names.join(', ')}`;
}
