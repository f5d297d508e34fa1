/**
 * Display of stored figures in the unit a screen (or the shop) chose. Pullbook stores power in hp,
 * torque in lb·ft, air in °C and kPa and displacement in cm³; every screen converts with these
 * helpers, which use the engine's NIST SP 811 factors (src/shared/analysis/units.ts). Pure TS, no DOM.
 */
import { cTo, hpTo, kpaTo, lbftTo } from './analysis/units';
import { ccToCubicInches } from './displacement';
import { formatGain, formatNumber, formatPercentChange } from './format';

/** The shop's unit system (shop settings, report and session units). */
export type UnitSystem = 'imperial' | 'metric';
export const UNIT_SYSTEMS = ['imperial', 'metric'] as const satisfies readonly UnitSystem[];

/** How a screen shows power and torque: labels and converters from the stored hp / lb·ft. */
export interface DisplayUnits {
  power: 'hp' | 'kW';
  torque: 'lb·ft' | 'N·m';
  /** Stored hp → the shown power unit. */
  p: (hp: number) => number;
  /** Stored lb·ft → the shown torque unit. */
  t: (lbft: number) => number;
}

const IMPERIAL_UNITS: DisplayUnits = { power: 'hp', torque: 'lb·ft', p: (v) => v, t: (v) => v };
const METRIC_UNITS: DisplayUnits = { power: 'kW', torque: 'N·m', p: (v) => hpTo(v, 'kw'), t: (v) => lbftTo(v, 'nm') };

/**
 * Power and torque units for a unit system, or for a comparison's `units` option ('hp-lbft' |
 * 'kw-nm'). Anything else (including undefined) shows what is stored: hp and lb·ft.
 */
export function displayUnits(units: UnitSystem | 'hp-lbft' | 'kw-nm' | undefined): DisplayUnits {
  return units === 'metric' || units === 'kw-nm' ? METRIC_UNITS : IMPERIAL_UNITS;
}

/** "+6.3 hp" / "+4.7 kW": a power gain in the shown unit. */
export const powerGain = (u: DisplayUnits, hp: number) => formatGain(u.p(hp), u.power, 1);
/** "+4.1 lb·ft" / "+5.6 N·m": a torque gain in the shown unit. */
export const torqueGain = (u: DisplayUnits, lbft: number) => formatGain(u.t(lbft), u.torque, 1);
/** "105.2 hp": a power figure in the shown unit. */
export const powerValue = (u: DisplayUnits, hp: number) => `${formatNumber(u.p(hp), { decimals: 1 })} ${u.power}`;
/** "78.4 lb·ft": a torque figure in the shown unit. */
export const torqueValue = (u: DisplayUnits, lbft: number) => `${formatNumber(u.t(lbft), { decimals: 1 })} ${u.torque}`;
/** "+6.1 %" from a percentage (6.1, not 0.061). */
export const pctChange = (pct: number) => formatPercentChange(pct / 100, 1);

/**
 * Air temperature in the shop's units: "70.3 °F" or "21.3 °C" (°F = °C × 9/5 + 32, exact by
 * definition; NIST SP 811).
 */
export function formatAirTemperature(celsius: number | null | undefined, system: UnitSystem, missing = 'not recorded'): string {
  if (typeof celsius !== 'number' || !Number.isFinite(celsius)) return missing;
  return system === 'imperial' ? `${formatNumber(cTo(celsius, 'f'), { decimals: 1 })} °F` : `${formatNumber(celsius, { decimals: 1 })} °C`;
}

/**
 * Barometric (station) pressure in the shop's units: "29.77 inHg" or "100.8 kPa"
 * (1 inHg = 3.38638 kPa; NIST SP 811).
 */
export function formatBarometric(kpa: number | null | undefined, system: UnitSystem, missing = 'not recorded'): string {
  if (typeof kpa !== 'number' || !Number.isFinite(kpa)) return missing;
  return system === 'imperial' ? `${formatNumber(kpaTo(kpa, 'inhg'), { decimals: 2 })} inHg` : `${formatNumber(kpa, { decimals: 1 })} kPa`;
}

/** "1,640 cm³" — whole cm³, as engine makers quote it. */
export const formatCc = (cc: number) => `${formatNumber(cc)} cm³`;
/** "100.1 in³" — one decimal, enough to tell 96.0 from 96.6 in³ apart (1 in³ = 16.387064 cm³ exactly). */
export const formatCubicInches = (cc: number) => `${formatNumber(ccToCubicInches(cc), { decimals: 1 })} in³`;
