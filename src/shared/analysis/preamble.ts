/**
 * Preamble reading: `key: value`, `key = value` or `key<delimiter>value[<delimiter>unit]` lines
 * before the table. Ambient temperature, barometric pressure and relative humidity are read with
 * their units; date, operator and notes are kept as text; anything else is kept under its key.
 */
import type { SourceLine } from './delimiter.js';
import { splitFields } from './delimiter.js';
import { normaliseName } from './header.js';
import { parseNumber } from './numbers.js';
import { type PressureUnit, parsePressureUnit, parseTemperatureUnit, pressureToKpa, temperatureToC } from './units.js';

/** Ambient conditions of a run, from the preamble or supplied by the caller. */
export interface Conditions {
  /** Ambient (inlet) air temperature, °C. */
  temperatureC?: number;
  /** Barometric (total) pressure, kPa. */
  baroKpa?: number;
  /** Relative humidity, % (0–100). */
  humidityPct?: number;
  date?: string;
  operator?: string;
  notes?: string;
  [k: string]: unknown;
}

type Field = 'temperature' | 'pressure' | 'humidity' | 'date' | 'operator' | 'notes';

function classifyKey(name: string): Field | undefined {
  if (/\b(humidity|rh|rel hum|relative humidity|hum)\b/.test(name)) return 'humidity';
  if (/\b(baro|barometer|barometric|pressure|atm|air pressure|ambient pressure|p amb)\b/.test(name)) return 'pressure';
  if (/\b(temp|temperature|ambient|air temp|ambient temp|t amb)\b/.test(name)) return 'temperature';
  if (/\b(date|time stamp|timestamp|recorded|when)\b/.test(name)) return 'date';
  if (/\b(operator|tuner|technician|tech|user|by)\b/.test(name)) return 'operator';
  if (/\b(notes?|comments?|remarks?|description)\b/.test(name)) return 'notes';
  return undefined;
}

/** Splits a preamble line into key, value and an optional unit. */
function splitKeyValue(text: string, delimiter: string): { key: string; value: string; unit: string; rest: string } | null {
  const colon = /^\s*([^:=;,\t|]{1,60}?)\s*[:=]\s*(.*)$/.exec(text);
  if (colon) return { key: colon[1], value: colon[2].trim(), unit: '', rest: colon[2].trim() };
  const cells = splitFields(text, delimiter).filter((c) => c.length > 0);
  if (cells.length >= 2 && !/^[+-]?[\d.,]+$/.test(cells[0])) {
    // Free text (notes) may itself contain the delimiter: keep everything after the key.
    const rest = text.slice(text.indexOf(delimiter) + 1).trim().replace(/^"|"$/g, '');
    return { key: cells[0], value: cells[1], unit: cells[2] ?? '', rest };
  }
  return null;
}

/** Guesses the unit of a pressure given without one, from its magnitude (common practice). */
function pressureUnitByMagnitude(v: number): PressureUnit | undefined {
  if (v >= 20 && v <= 35) return 'inhg';
  if (v >= 60 && v <= 115) return 'kpa';
  if (v >= 600 && v <= 800) return 'mmhg';
  if (v >= 800 && v <= 1150) return 'hpa';
  if (v >= 9 && v <= 17) return 'psi';
  return undefined;
}

function splitNumberAndUnit(value: string, extraUnit: string, decimalComma: boolean): { n: number; unit: string } {
  const m = /^\s*([+-]?[\d.,]+)\s*(.*)$/.exec(value);
  if (!m) return { n: NaN, unit: '' };
  let n = parseNumber(m[1], decimalComma);
  if (Number.isNaN(n)) n = parseNumber(m[1], !decimalComma);
  return { n, unit: (m[2] || extraUnit).trim() };
}

/** Reads conditions from preamble lines. Unrecognised values are kept under their own key. */
export function parsePreamble(lines: SourceLine[], delimiter: string, decimalComma: boolean): Conditions {
  const out: Conditions = {};
  for (const line of lines) {
    const kv = splitKeyValue(line.text, delimiter);
    if (!kv || kv.value.length === 0) continue;
    const name = normaliseName(kv.key);
    const keyUnit = /[[(]([^\])]+)[\])]/.exec(kv.key)?.[1] ?? '';
    const field = classifyKey(name);
    const { n, unit } = splitNumberAndUnit(kv.value, kv.unit || keyUnit, decimalComma);
    if (field === 'temperature' && Number.isFinite(n)) {
      const u = parseTemperatureUnit(unit.replace(/^°/, '')) ?? (unit.includes('°F') || unit.includes('F') ? 'f' : 'c');
      out.temperatureC = temperatureToC(n, u);
    } else if (field === 'pressure' && Number.isFinite(n)) {
      const u = parsePressureUnit(unit) ?? pressureUnitByMagnitude(n);
      if (u) out.baroKpa = pressureToKpa(n, u);
      else out[name.replace(/ /g, '_')] = kv.value;
    } else if (field === 'humidity' && Number.isFinite(n)) {
      out.humidityPct = n <= 1 && !unit.includes('%') && !kv.value.includes('%') ? n * 100 : n;
    } else if (field === 'notes') {
      out.notes = kv.rest;
    } else if (field === 'date' || field === 'operator') {
      out[field] = kv.value;
    } else if (name.length > 0) {
      out[name.replace(/ /g, '_')] = kv.value;
    }
  }
  return out;
}
