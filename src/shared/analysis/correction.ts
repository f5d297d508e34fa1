/**
 * Atmospheric correction to standard air. Browser-safe.
 *
 * Pd is the dry-air pressure in kPa: barometric pressure − RH × saturation vapour pressure
 * (Buck 1981). Temperatures are absolute; each standard's reference temperature is written in °C
 * and converted with +273.15 on both sides of the ratio, so every factor is exactly 1 at its own
 * reference conditions (the standards print the rounded 298 K / 293 K / 520 °R).
 *
 * Motorcycle engine test practice is covered by ISO 4106; shops choose the standard their
 * customers expect, and figures are only comparable under the same standard.
 */
import { AnalysisError } from './errors.js';
import type { Conditions } from './preamble.js';
import { pressureToKpa, saturationVapourPressureKpa, temperatureToC } from './units.js';

/** Supported correction standards. */
export type CorrectionStandard = 'none' | 'sae-j1349' | 'sae-j1349-1990' | 'iso-1585' | 'din-70020' | 'sae-j607';

/** Reference conditions of a standard. */
export interface ReferenceConditions {
  temperatureC: number;
  /** Reference pressure in kPa; dry-air pressure unless `pressureIsTotal`. */
  pressureKpa: number;
  pressureIsTotal: boolean;
}

/** Reference conditions per standard (for tests and the help text). */
export const REFERENCE_CONDITIONS: Record<Exclude<CorrectionStandard, 'none'>, ReferenceConditions> = {
  'sae-j1349': { temperatureC: 25, pressureKpa: 99, pressureIsTotal: false },
  'sae-j1349-1990': { temperatureC: 25, pressureKpa: 99, pressureIsTotal: false },
  'iso-1585': { temperatureC: 25, pressureKpa: 99, pressureIsTotal: false },
  'din-70020': { temperatureC: 20, pressureKpa: 101.3, pressureIsTotal: true },
  'sae-j607': { temperatureC: temperatureToC(60, 'f'), pressureKpa: pressureToKpa(29.92, 'inhg'), pressureIsTotal: false },
};

/** The standards with a label and a plain description, in the order the UI lists them. */
export const CORRECTION_STANDARDS: readonly { id: CorrectionStandard; label: string; description: string }[] = [
  { id: 'none', label: 'Uncorrected', description: 'Figures as measured, no correction to standard air.' },
  {
    id: 'sae-j1349',
    label: 'SAE J1349',
    description: 'Current SAE form: 25 °C, 99 kPa dry air; CF = 1.176 · (99/Pd) · √(T/298) − 0.176.',
  },
  {
    id: 'sae-j1349-1990',
    label: 'SAE J1349 (1990)',
    description: 'Earlier SAE form: 25 °C, 99 kPa dry air; CF = 1.18 · (99/Pd) · √(T/298) − 0.18.',
  },
  {
    id: 'iso-1585',
    label: 'ISO 1585',
    description: 'ISO / EEC 80/1269 family: 25 °C, 99 kPa dry air; CF = (99/Pd)^1.2 · (T/298)^0.6.',
  },
  {
    id: 'din-70020',
    label: 'DIN 70020',
    description: 'German standard: 20 °C, 1013 mbar total pressure, no humidity term; CF = (1013/p) · √(T/293).',
  },
  {
    id: 'sae-j607',
    label: 'SAE J607',
    description: 'Small-engine standard: 60 °F, 29.92 inHg dry air; CF = (29.92/Pd) · √(T/520 °R). Reads about 4 % above SAE J1349.',
  },
];

/** Dry-air pressure in kPa: barometric − RH × saturation vapour pressure at the air temperature. */
export function dryAirPressureKpa(baroKpa: number, temperatureC: number, humidityPct = 0): number {
  return baroKpa - (humidityPct / 100) * saturationVapourPressureKpa(temperatureC);
}

function need(standard: CorrectionStandard, c: Partial<Conditions>): { t: number; p: number; rh: number } {
  const t = c.temperatureC;
  const p = c.baroKpa;
  const missing: string[] = [];
  if (typeof t !== 'number' || !Number.isFinite(t)) missing.push('air temperature');
  if (typeof p !== 'number' || !Number.isFinite(p)) missing.push('barometric pressure');
  if (missing.length) {
    throw new AnalysisError('CONDITIONS_MISSING', `${standard} correction needs the ${missing.join(' and ')}.`);
  }
  const rh = typeof c.humidityPct === 'number' && Number.isFinite(c.humidityPct) ? c.humidityPct : 0;
  if ((t as number) < -60 || (t as number) > 70) throw new AnalysisError('CONDITIONS_MISSING', `An air temperature of ${t} °C is not plausible.`);
  if ((p as number) < 50 || (p as number) > 120) throw new AnalysisError('CONDITIONS_MISSING', `A barometric pressure of ${p} kPa is not plausible.`);
  if (rh < 0 || rh > 100) throw new AnalysisError('CONDITIONS_MISSING', `A relative humidity of ${rh} % is not plausible.`);
  return { t: t as number, p: p as number, rh };
}

/**
 * Correction factor of a standard for the given conditions (multiply observed power and torque
 * by it). Humidity defaults to 0 % (dry) when absent. Throws `CONDITIONS_MISSING` when the
 * temperature or pressure is missing or implausible; 'none' always gives 1.
 */
export function correctionFactor(standard: CorrectionStandard, conditions: Partial<Conditions>): number {
  if (standard === 'none') return 1;
  const ref = REFERENCE_CONDITIONS[standard];
  if (!ref) throw new AnalysisError('INVALID_OPTION', `Unknown correction standard "${String(standard)}".`);
  const { t, p, rh } = need(standard, conditions);
  const tempRatio = (t + 273.15) / (ref.temperatureC + 273.15);
  const pressure = ref.pressureIsTotal ? p : dryAirPressureKpa(p, t, rh);
  const pressureRatio = ref.pressureKpa / pressure;
  switch (standard) {
    case 'sae-j1349':
      // 1.176·r − 0.176 written as 1 + 1.176·(r − 1) so that r = 1 gives exactly 1.
      return 1 + 1.176 * (pressureRatio * Math.sqrt(tempRatio) - 1);
    case 'sae-j1349-1990':
      return 1 + 1.18 * (pressureRatio * Math.sqrt(tempRatio) - 1);
    case 'iso-1585':
      return pressureRatio ** 1.2 * tempRatio ** 0.6;
    case 'din-70020':
    case 'sae-j607':
      return pressureRatio * Math.sqrt(tempRatio);
  }
}

/** True when the id is a supported standard. */
export function isCorrectionStandard(id: unknown): id is CorrectionStandard {
  return CORRECTION_STANDARDS.some((s) => s.id === id);
}
