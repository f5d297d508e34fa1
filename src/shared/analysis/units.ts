/**
 * Unit conversions for dyno data. Browser-safe: no Node imports (the client imports this file for
 * unit switching).
 *
 * Factors are derived from exact definitions and agree with NIST SP 811 (2008), Appendix B.8/B.9,
 * to every digit printed there:
 *   1 ft = 0.3048 m (exact), 1 lbf = 4.4482216152605 N (exact) → 1 lbf·ft = 1.355818 N·m;
 *   1 hp (550 ft·lbf/s) = 745.6999 W; 1 PS (metric horsepower, 75 kgf·m/s) = 735.49875 W (exact);
 *   1 kgf = 9.80665 N (exact); 1 mi = 1609.344 m (exact);
 *   1 inHg (32 °F) = 3.38638 kPa; 1 psi = 6.894757 kPa; 1 mmHg (0 °C) = 0.1333224 kPa.
 */

/** Torque units accepted in files and options. */
export type TorqueUnit = 'lbft' | 'nm' | 'kgfm';
/** Power units accepted in files and options. `hp` is mechanical horsepower (550 ft·lbf/s); `ps` is metric horsepower. */
export type PowerUnit = 'hp' | 'kw' | 'ps';
/** Road / roller speed units. */
export type SpeedUnit = 'mph' | 'kmh';
/** Temperature units. */
export type TemperatureUnit = 'c' | 'f' | 'k';
/** Pressure units. `inhg` is inches of mercury at 32 °F, `mmhg` millimetres of mercury at 0 °C. */
export type PressureUnit = 'kpa' | 'hpa' | 'mbar' | 'inhg' | 'psi' | 'mmhg';

const FOOT_M = 0.3048;
const POUND_FORCE_N = 4.4482216152605;
const KILOGRAM_FORCE_N = 9.80665;

/** N·m in one lbf·ft (≈ 1.355818, NIST SP 811). */
export const NM_PER_LBFT = FOOT_M * POUND_FORCE_N;
/** N·m in one kgf·m (9.80665, exact). */
export const NM_PER_KGFM = KILOGRAM_FORCE_N;
/** Watts in one mechanical horsepower, 550 ft·lbf/s (≈ 745.6999 W, NIST SP 811). */
export const W_PER_HP = 550 * NM_PER_LBFT;
/** Watts in one metric horsepower (PS), 75 kgf·m/s = 735.49875 W exactly. */
export const W_PER_PS = 75 * KILOGRAM_FORCE_N;

/**
 * hp = lb·ft × rpm / HP_TORQUE_CONSTANT. 1 hp = 550 ft·lbf/s = 33 000 ft·lbf/min and one
 * revolution is 2π rad, so the constant is 33 000 / 2π ≈ 5252.113.
 */
export const HP_TORQUE_CONSTANT = 33_000 / (2 * Math.PI);
/** kW = N·m × rpm / KW_TORQUE_CONSTANT; 60 000 / 2π ≈ 9549.297. */
export const KW_TORQUE_CONSTANT = 60_000 / (2 * Math.PI);

const TORQUE_IN_NM: Record<TorqueUnit, number> = { lbft: NM_PER_LBFT, nm: 1, kgfm: NM_PER_KGFM };
const POWER_IN_W: Record<PowerUnit, number> = { hp: W_PER_HP, kw: 1000, ps: W_PER_PS };

/** Converts a torque value to lb·ft. */
export function torqueToLbft(v: number, unit: TorqueUnit): number {
  return unit === 'lbft' ? v : (v * TORQUE_IN_NM[unit]) / NM_PER_LBFT;
}
/** Converts a torque value in lb·ft to another unit. */
export function lbftTo(v: number, unit: TorqueUnit): number {
  return unit === 'lbft' ? v : (v * NM_PER_LBFT) / TORQUE_IN_NM[unit];
}
/** Converts a power value to mechanical horsepower. */
export function powerToHp(v: number, unit: PowerUnit): number {
  return unit === 'hp' ? v : (v * POWER_IN_W[unit]) / W_PER_HP;
}
/** Converts a power value in hp to another unit. */
export function hpTo(v: number, unit: PowerUnit): number {
  return unit === 'hp' ? v : (v * W_PER_HP) / POWER_IN_W[unit];
}
/** Power in hp from torque in lb·ft at an engine speed (the cross-check identity). */
export function hpFromLbft(lbft: number, rpm: number): number {
  return (lbft * rpm) / HP_TORQUE_CONSTANT;
}
/** Torque in lb·ft from power in hp at an engine speed (undefined at 0 rpm → returns 0). */
export function lbftFromHp(hp: number, rpm: number): number {
  return rpm === 0 ? 0 : (hp * HP_TORQUE_CONSTANT) / rpm;
}

/** km/h in one mph (1.609344, exact). */
export const KMH_PER_MPH = 1.609344;
/** Converts a speed to km/h. */
export function speedToKmh(v: number, unit: SpeedUnit): number {
  return unit === 'kmh' ? v : v * KMH_PER_MPH;
}
/** Converts a speed in km/h to another unit. */
export function kmhTo(v: number, unit: SpeedUnit): number {
  return unit === 'kmh' ? v : v / KMH_PER_MPH;
}

/** Converts a temperature to °C. */
export function temperatureToC(v: number, unit: TemperatureUnit): number {
  if (unit === 'f') return ((v - 32) * 5) / 9;
  if (unit === 'k') return v - 273.15;
  return v;
}
/** Converts a temperature in °C to another unit. */
export function cTo(v: number, unit: TemperatureUnit): number {
  if (unit === 'f') return (v * 9) / 5 + 32;
  if (unit === 'k') return v + 273.15;
  return v;
}

const PRESSURE_IN_KPA: Record<PressureUnit, number> = {
  kpa: 1,
  hpa: 0.1,
  mbar: 0.1,
  inhg: 3.38638,
  psi: 6.894757,
  mmhg: 0.1333224,
};
/** Converts a pressure to kPa. */
export function pressureToKpa(v: number, unit: PressureUnit): number {
  return v * PRESSURE_IN_KPA[unit];
}
/** Converts a pressure in kPa to another unit. */
export function kpaTo(v: number, unit: PressureUnit): number {
  return v / PRESSURE_IN_KPA[unit];
}

/**
 * Saturation vapour pressure of water over a plane water surface, in kPa, by Buck (1981),
 * "New equations for computing vapor pressure and enhancement factor", J. Appl. Meteor. 20,
 * eq. 8 (ew1): e = 0.61121 · exp(17.502 · T / (240.97 + T)), T in °C.
 */
export function saturationVapourPressureKpa(tempC: number): number {
  return 0.61121 * Math.exp((17.502 * tempC) / (240.97 + tempC));
}

/** Stoichiometric air–fuel ratio of gasoline used to turn lambda into AFR (14.7, common practice). */
export const GASOLINE_STOICH_AFR = 14.7;

/** Parses a free-text torque unit ("ft-lb", "N·m", "kgm" …); undefined when not a torque unit. */
export function parseTorqueUnit(text: string): TorqueUnit | undefined {
  const t = text.toLowerCase().replace(/[^a-z]/g, '');
  if (/^(lbft|ftlb|ftlbs|lbsft|lbfft|ftlbf|lbf)$/.test(t)) return 'lbft';
  if (/^(nm|newtonmeters?|newtonmetres?)$/.test(t)) return 'nm';
  if (/^(kgm|kgfm|mkg|kpm)$/.test(t)) return 'kgfm';
  return undefined;
}
/** Parses a free-text power unit ("hp", "kW", "PS", "CV" …); undefined when not a power unit. */
export function parsePowerUnit(text: string): PowerUnit | undefined {
  const t = text.toLowerCase().replace(/[^a-z]/g, '');
  if (/^(hp|bhp|whp|shp)$/.test(t)) return 'hp';
  if (/^(kw|kilowatts?)$/.test(t)) return 'kw';
  if (/^(ps|cv|pk|metrichp)$/.test(t)) return 'ps';
  return undefined;
}
/** Parses a free-text pressure unit; undefined when not a pressure unit. */
export function parsePressureUnit(text: string): PressureUnit | undefined {
  const t = text.toLowerCase().replace(/[^a-z]/g, '');
  if (t === 'kpa') return 'kpa';
  if (t === 'hpa') return 'hpa';
  if (t === 'mbar' || t === 'mb' || t === 'millibar') return 'mbar';
  if (t === 'inhg' || t === 'inchhg' || t === 'inmerc' || t === 'hg') return 'inhg';
  if (t === 'psi' || t === 'psia') return 'psi';
  if (t === 'mmhg' || t === 'torr') return 'mmhg';
  return undefined;
}
/** Parses a free-text temperature unit ("°C", "degF", "K"); undefined when not a temperature unit. */
export function parseTemperatureUnit(text: string): TemperatureUnit | undefined {
  const t = text.toLowerCase().replace(/[^a-z]/g, '');
  if (t === 'c' || t === 'degc' || t === 'celsius') return 'c';
  if (t === 'f' || t === 'degf' || t === 'fahrenheit') return 'f';
  if (t === 'k' || t === 'kelvin') return 'k';
  return undefined;
}
/** Parses a free-text speed unit ("mph", "km/h", "kph"); undefined when not a speed unit. */
export function parseSpeedUnit(text: string): SpeedUnit | undefined {
  const t = text.toLowerCase().replace(/[^a-z]/g, '');
  if (t === 'mph') return 'mph';
  if (t === 'kmh' || t === 'kph' || t === 'kmph') return 'kmh';
  return undefined;
}
