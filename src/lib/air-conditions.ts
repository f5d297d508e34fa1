import { cTo, kpaTo } from '@shared/analysis/units';
import { formatNumber } from '@shared/format';

/** The shop's unit system (shop settings); Pullbook stores air conditions in °C and kPa. */
export type UnitSystem = 'imperial' | 'metric';

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
