/**
 * Column recognition: by name (with units from the header) and by plausibility of values.
 * Produces a column plan with a 0..1 confidence, or says which columns the user must map.
 */
import { AnalysisError } from './errors.js';
import { type HeaderCell, headerSignature, normaliseName, parseHeaderCell } from './header.js';
import { parseNumber } from './numbers.js';
import type { AnalysisWarning } from './warnings.js';
import {
  HP_TORQUE_CONSTANT,
  type PowerUnit,
  type SpeedUnit,
  type TorqueUnit,
  parsePowerUnit,
  parseSpeedUnit,
  parseTorqueUnit,
  powerToHp,
  torqueToLbft,
} from './units.js';

/** User-supplied column mapping (overrides recognition). Column names are header texts, or `#N` (1-based index). */
export interface ColumnMapping {
  rpm: string;
  torque?: { column: string; unit: TorqueUnit };
  power?: { column: string; unit: PowerUnit };
  [k: string]: unknown;
}

/** Which column index plays which role, with units. */
export interface ColumnPlan {
  rpm: number;
  /** Factor turning the rpm column's values into rpm (1; 1000 for krpm; rpm per speed unit for a speed column). */
  rpmScale: number;
  torque: { index: number; unit: TorqueUnit; unitAssumed: boolean } | null;
  power: { index: number; unit: PowerUnit; unitAssumed: boolean } | null;
  time: number | null;
  speed: { index: number; unit: SpeedUnit } | null;
  manifoldPressure: number | null;
  intakeAirTemp: number | null;
  /** AFR channels; `lambda` true when the channel holds lambda (converted to AFR on output). */
  afr: { index: number; lambda: boolean }[];
  confidence: number;
  cells: HeaderCell[];
  signature: string;
  warnings: AnalysisWarning[];
}

/** Help for the mapping screen, carried in `details` of NEEDS_MAPPING / NO_RPM_COLUMN / NO_POWER_OR_TORQUE. */
export interface MappingHelp {
  headers: string[];
  previewRows: string[][];
  suggestions: Partial<ColumnMapping>;
  headerSignature: string;
  /** Roles the user must map. */
  needs: string[];
  /** For NO_RPM_COLUMN: the road/roller speed column found, when there is one. */
  speedColumn?: string;
  /** For NO_RPM_COLUMN with a speed column: how to compute engine speed from it. */
  rpmPerSpeedHint?: string;
}

/** Engine speed per road speed for the gear used (e.g. 46 rpm per mph). */
export interface RpmPerSpeed {
  ratio: number;
  unit: 'mph' | 'km/h';
}

/** NIST SP 811 (2008), Appendix B: 1 mile = 1609.344 m exactly, so 1 mph = 1.609344 km/h. */
export const KMH_PER_MPH = 1.609344;

/** Most columns a run file may have. */
export const MAX_COLUMNS = 256;

// Names are matched accent-folded and lower-case (HeaderCell.key). Besides English: German,
// French, Italian, Spanish and Dutch names for engine speed, torque, power, time and road speed.
const RPM_NAME =
  /^(engine speed|engine rpm|eng rpm|eng speed|rpm|rpm engine|engine|revs?|n|motor speed|motor rpm|engine revs|speed rpm|crank rpm|rpm eng|e rpm|drehzahl|motordrehzahl|motor drehzahl|n motor|regime|regime moteur|vitesse moteur|regime motore|giri|giri motore|regimen|regimen motor|regimen del motor|toerental|motortoerental|motor toerental|toeren)$/;
const ROLLER_NAME = /(roller|drum|wheel|road|vehicle|veh|ground|rolle|rouleau|rullo|rodillo|fahrzeug|vehicule|veicolo|vehiculo|voertuig)/;
const TORQUE_NAME =
  /^(torque|tq|trq|engine torque|wheel torque|tor|rear wheel torque|corrected torque|obs torque|observed torque|uncorrected torque|drehmoment|motordrehmoment|couple|couple moteur|coppia|coppia motore|par|par motor|koppel|motorkoppel)(\s.*)?$/;
const POWER_NAME =
  /^(power|pwr|hp|bhp|whp|kw|ps|engine power|wheel power|rear wheel power|corrected power|obs power|observed power|uncorrected power|horsepower|leistung|motorleistung|puissance|potenza|potencia|vermogen)(\s.*)?$/;
const TIME_NAME = /^(time|t|elapsed|elapsed time|timestamp|time s|sec|seconds|zeit|temps|tempo|tiempo|tijd)$/;
const SPEED_NAME =
  /^(speed|road speed|roller speed|vehicle speed|veh speed|wheel speed|drum speed|mph|kmh|km h|kph|velocity|geschwindigkeit|vitesse|velocita|velocidad|snelheid)$/;
/** Engine speed logged in thousands: `x1000`, `krpm`, `1000 rpm`, `rpm x 1000`. */
const THOUSANDS = /(^|\s)(x\s?1000|krpm|1000\s?(rpm|1 min|u min|tr min)|(rpm|1 min|u min|tr min)\s?x\s?1000)(\s|$)/;
/** Units meaning revolutions per minute (accent-free). */
const RPM_UNIT = /^(rpm|1\/min|min-1|min\^-1|rev\/min|u\/min|r\/min|tr\/min|giri\/min|omw\/min|t\/min)$/;
const AFR_NAME = /^(afr|a f|air fuel|air fuel ratio|afr\s?.+|.+\safr|a f ratio|a f\s.+|wideband.*|o2.*)$/;
const LAMBDA_NAME = /^(lambda|lam|lambda\s?.+|.+\slambda)$/;
const MAP_NAME = /^(map|manifold pressure|manifold abs pressure|boost|manifold|map kpa|intake pressure)$/;
const IAT_NAME = /^(iat|intake air temp|intake air temperature|air temp|inlet air temp|intake temp|mat|air intake temp)$/;

/** Unit embedded in a name such as `tq_ftlb`, `power_kw`, `hp` itself. */
function unitSuffix(name: string): string {
  const words = name.split(' ');
  for (let i = words.length - 1; i >= 1; i--) {
    const tail = words.slice(i).join('');
    if (parseTorqueUnit(tail) || parsePowerUnit(tail) || parseSpeedUnit(tail) || tail === 'rpm' || tail === 'krpm') return tail;
  }
  return '';
}

function resolveMappingColumn(spec: string, cells: HeaderCell[]): number {
  const hash = /^#(\d+)$/.exec(spec.trim());
  if (hash) {
    const i = Number(hash[1]) - 1;
    if (i >= 0 && i < cells.length) return i;
  }
  let i = cells.findIndex((c) => c.original === spec);
  if (i < 0) i = cells.findIndex((c) => c.original.toLowerCase() === spec.toLowerCase());
  if (i < 0) i = cells.findIndex((c) => c.name === normaliseName(spec));
  if (i < 0) throw new AnalysisError('MAPPING_INVALID', `The mapping names a column that is not in the file: "${spec}".`, { column: spec });
  return i;
}

function columnValues(preview: string[][], index: number, decimalComma: boolean): number[] {
  const out: number[] = [];
  for (const row of preview) {
    const v = parseNumber(row[index] ?? '', decimalComma);
    if (Number.isFinite(v)) out.push(v);
  }
  return out;
}

function medianOf(values: number[]): number {
  if (values.length === 0) return NaN;
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** Median relative deviation of power vs torque × rpm for a candidate pair (sniffing only). */
function pairDeviation(rpm: number[], tq: number[], pw: number[]): { unitT: TorqueUnit; unitP: PowerUnit; dev: number } {
  let best = { unitT: 'lbft' as TorqueUnit, unitP: 'hp' as PowerUnit, dev: Infinity };
  for (const [unitT, unitP] of [['lbft', 'hp'], ['nm', 'kw'], ['nm', 'ps'], ['nm', 'hp']] as const) {
    const devs: number[] = [];
    for (let i = 0; i < rpm.length; i++) {
      const p = powerToHp(pw[i], unitP);
      if (!(p > 1)) continue;
      devs.push(Math.abs(p - (torqueToLbft(tq[i], unitT) * rpm[i]) / HP_TORQUE_CONSTANT) / p);
    }
    const d = devs.length >= 5 ? medianOf(devs) : Infinity;
    if (d < best.dev) best = { unitT, unitP, dev: d };
  }
  return best;
}

/**
 * Recognises columns from header cells and preview rows (or applies a mapping). Throws
 * `NO_RPM_COLUMN`, `NO_POWER_OR_TORQUE` or `NEEDS_MAPPING` (with {@link MappingHelp}), or
 * `MAPPING_INVALID`, or `TOO_MANY_COLUMNS`.
 */
export function recogniseColumns(
  header: string[] | null,
  unitsRow: string[] | null,
  preview: string[][],
  fieldCount: number,
  decimalComma: boolean,
  mapping?: ColumnMapping,
  rpmPerSpeed?: RpmPerSpeed,
): ColumnPlan {
  const width = Math.max(fieldCount, header?.length ?? 0);
  if (width > MAX_COLUMNS) throw new AnalysisError('TOO_MANY_COLUMNS', `The table has ${width} columns; at most ${MAX_COLUMNS} are accepted.`);
  const cells: HeaderCell[] = [];
  for (let i = 0; i < width; i++) {
    const text = header?.[i] && header[i].length > 0 ? header[i] : `column ${i + 1}`;
    cells.push(parseHeaderCell(text, unitsRow?.[i]));
  }
  const signature = headerSignature(cells);
  const warnings: AnalysisWarning[] = [];
  const plan: ColumnPlan = {
    rpm: -1, rpmScale: 1, torque: null, power: null, time: null, speed: null, manifoldPressure: null, intakeAirTemp: null, afr: [],
    confidence: 0, cells, signature, warnings,
  };
  const help = (needs: string[], suggestions: Partial<ColumnMapping>): MappingHelp => ({
    headers: cells.map((c) => c.original),
    previewRows: preview.slice(0, 10),
    suggestions,
    headerSignature: signature,
    needs,
  });

  if (mapping) {
    if (typeof mapping.rpm !== 'string') throw new AnalysisError('MAPPING_INVALID', 'The mapping must name the engine-speed column (rpm).');
    plan.rpm = resolveMappingColumn(mapping.rpm, cells);
    if (mapping.torque) {
      if (!['lbft', 'nm', 'kgfm'].includes(mapping.torque.unit)) throw new AnalysisError('MAPPING_INVALID', 'The torque unit must be lbft, nm or kgfm.');
      plan.torque = { index: resolveMappingColumn(mapping.torque.column, cells), unit: mapping.torque.unit, unitAssumed: false };
    }
    if (mapping.power) {
      if (!['hp', 'kw', 'ps'].includes(mapping.power.unit)) throw new AnalysisError('MAPPING_INVALID', 'The power unit must be hp, kw or ps.');
      plan.power = { index: resolveMappingColumn(mapping.power.column, cells), unit: mapping.power.unit, unitAssumed: false };
    }
    if (!plan.torque && !plan.power) throw new AnalysisError('MAPPING_INVALID', 'The mapping must name a torque or a power column.');
    plan.confidence = 1;
  }

  // Name-based recognition (also fills the optional channels when a mapping is given).
  let rpmConfidence = 0;
  let torqueConfidence = 0;
  let powerConfidence = 0;
  const taken = new Set<number>([plan.rpm, plan.torque?.index ?? -1, plan.power?.index ?? -1]);
  cells.forEach((cell, i) => {
    if (taken.has(i)) return;
    const thousands = THOUSANDS.test(`${cell.key} ${cell.unit.replace(/[^a-z0-9]+/g, ' ')}`.trim()) || cell.unit === 'krpm' || /(^|\s)krpm$/.test(cell.key);
    const name = thousands ? cell.key.replace(/(^|\s)(x\s?1000|krpm|1000)(?=\s|$)/g, ' ').trim() || 'rpm' : cell.key;
    const unit = thousands ? 'rpm' : cell.unit || unitSuffix(name);
    const bare = unitSuffix(name) ? name.slice(0, name.length - unitSuffix(name).length).trim() || name : name;
    const unitIsRpm = RPM_UNIT.test(unit);
    if (!mapping && plan.rpm < 0 && !ROLLER_NAME.test(name) && (RPM_NAME.test(name) || RPM_NAME.test(bare) || (unitIsRpm && /speed|rpm|engine|drehzahl|regime|giri|toeren|n\b/.test(name)))) {
      plan.rpm = i;
      rpmConfidence = RPM_NAME.test(name) || unitIsRpm ? 1 : 0.8;
      if (thousands) {
        plan.rpmScale = 1000;
        warnings.push({ code: 'RPM_SCALED', message: `Engine speed in "${cell.original}" is labelled in thousands of rpm; its values were multiplied by 1000.` });
      }
      return;
    }
    if (!mapping && !plan.torque && (TORQUE_NAME.test(name) || TORQUE_NAME.test(bare) || (parseTorqueUnit(unit) && !POWER_NAME.test(name)))) {
      const u = parseTorqueUnit(unit);
      plan.torque = { index: i, unit: u ?? 'lbft', unitAssumed: !u };
      torqueConfidence = u ? 1 : 0.8;
      return;
    }
    if (!mapping && !plan.power && (POWER_NAME.test(name) || POWER_NAME.test(bare) || parsePowerUnit(unit))) {
      const u = parsePowerUnit(unit) ?? parsePowerUnit(bare);
      plan.power = { index: i, unit: u ?? 'hp', unitAssumed: !u };
      powerConfidence = u ? 1 : 0.8;
      return;
    }
    if (LAMBDA_NAME.test(name) || unit === 'lambda' || unit === 'λ') {
      plan.afr.push({ index: i, lambda: true });
      return;
    }
    if (AFR_NAME.test(name) || unit === 'afr' || unit === 'a/f') {
      plan.afr.push({ index: i, lambda: false });
      return;
    }
    if (plan.time === null && (TIME_NAME.test(name) || TIME_NAME.test(bare))) {
      plan.time = i;
      return;
    }
    const speedUnit = parseSpeedUnit(unit) ?? parseSpeedUnit(bare);
    if (plan.speed === null && (SPEED_NAME.test(name) || SPEED_NAME.test(bare) || speedUnit || ROLLER_NAME.test(name)) && !unitIsRpm) {
      plan.speed = { index: i, unit: speedUnit ?? 'mph' };
      return;
    }
    if (plan.manifoldPressure === null && MAP_NAME.test(bare)) {
      plan.manifoldPressure = i;
      return;
    }
    if (plan.intakeAirTemp === null && IAT_NAME.test(bare)) plan.intakeAirTemp = i;
  });
  if (mapping) {
    settleRpmScale(plan, preview, decimalComma);
    return plan;
  }

  // Plausibility of values when names did not settle it.
  const numericCols = cells.map((_, i) => columnValues(preview, i, decimalComma));
  const free = (i: number) =>
    i !== plan.rpm && i !== plan.torque?.index && i !== plan.power?.index && i !== plan.time && !plan.afr.some((a) => a.index === i) &&
    i !== plan.speed?.index && i !== plan.manifoldPressure && i !== plan.intakeAirTemp;
  if (plan.rpm < 0 && plan.speed && rpmPerSpeed) {
    if (!(Number.isFinite(rpmPerSpeed.ratio) && rpmPerSpeed.ratio > 0) || !['mph', 'km/h'].includes(rpmPerSpeed.unit)) {
      throw new AnalysisError('INVALID_OPTION', 'The engine-speed ratio must be a positive number of rpm per mph or per km/h.');
    }
    const columnUnit = plan.speed.unit === 'kmh' ? 'km/h' : 'mph';
    const convert = columnUnit === rpmPerSpeed.unit ? 1 : columnUnit === 'km/h' ? 1 / KMH_PER_MPH : KMH_PER_MPH;
    plan.rpm = plan.speed.index;
    plan.rpmScale = rpmPerSpeed.ratio * convert;
    rpmConfidence = 1;
    const speedName = cells[plan.speed.index].original;
    plan.speed = null;
    warnings.push({
      code: 'RPM_FROM_SPEED',
      message: `The file has no engine-speed column; engine speed was computed from "${speedName}" (${columnUnit}) at ${rpmPerSpeed.ratio} rpm per ${rpmPerSpeed.unit}. It is only right for the gear that ratio belongs to.`,
    });
  }
  if (plan.rpm < 0) {
    let bestI = -1;
    let bestRange = 0;
    numericCols.forEach((vals, i) => {
      if (!free(i) || vals.length < Math.min(5, preview.length)) return;
      const lo = Math.min(...vals);
      const hi = Math.max(...vals);
      if (lo >= 0 && hi >= 1500 && hi <= 20_000 && hi - lo > bestRange) {
        bestRange = hi - lo;
        bestI = i;
      }
    });
    if (bestI >= 0) {
      plan.rpm = bestI;
      rpmConfidence = 0.5;
    }
  }
  if (plan.rpm < 0) {
    if (plan.speed) {
      const speedColumn = cells[plan.speed.index].original;
      const unit = plan.speed.unit === 'kmh' ? 'km/h' : 'mph';
      throw new AnalysisError(
        'NO_RPM_COLUMN',
        `No engine-speed (rpm) column was found, but there is a road/roller speed column ("${speedColumn}"). Give the engine-speed ratio for the gear used (rpm per mph or per km/h) to compute engine speed from it, or map the columns by hand.`,
        { details: { ...help(['rpm'], {}), speedColumn, rpmPerSpeedHint: `Engine speed = ${unit} × ratio (rpm per ${unit}, for the gear used); e.g. the rpm shown at a steady road speed, divided by that speed.` } },
      );
    }
    throw new AnalysisError('NO_RPM_COLUMN', 'No engine-speed (rpm) column was found; map the columns by hand.', {
      details: help(['rpm'], {}),
    });
  }
  settleRpmScale(plan, preview, decimalComma);
  if (!plan.torque && !plan.power) {
    // Try every free pair: the one obeying power = torque × rpm / 5252 is very likely right.
    const rpmVals = preview.map((r) => parseNumber(r[plan.rpm] ?? '', decimalComma));
    let best: { t: number; p: number; unitT: TorqueUnit; unitP: PowerUnit; dev: number } | null = null;
    for (let t = 0; t < cells.length; t++) {
      for (let p = 0; p < cells.length; p++) {
        if (t === p || !free(t) || !free(p)) continue;
        const tq = preview.map((r) => parseNumber(r[t] ?? '', decimalComma));
        const pw = preview.map((r) => parseNumber(r[p] ?? '', decimalComma));
        const d = pairDeviation(rpmVals, tq, pw);
        if (!best || d.dev < best.dev) best = { t, p, ...d };
      }
    }
    if (best && best.dev < 0.015) {
      plan.torque = { index: best.t, unit: best.unitT, unitAssumed: false };
      plan.power = { index: best.p, unit: best.unitP, unitAssumed: false };
      torqueConfidence = powerConfidence = 0.6;
      warnings.push({
        code: 'COLUMNS_GUESSED',
        message: `Torque and power were recognised from their values ("${cells[best.t].original}", "${cells[best.p].original}"), not their names.`,
      });
    } else {
      const suggestions: Partial<ColumnMapping> = { rpm: cells[plan.rpm].original };
      const needs = rpmConfidence < 1 ? ['rpm', 'torque', 'power'] : ['torque', 'power'];
      const anyNumericFree = numericCols.some((v, i) => free(i) && v.length > 0);
      throw new AnalysisError(
        anyNumericFree ? 'NEEDS_MAPPING' : 'NO_POWER_OR_TORQUE',
        anyNumericFree
          ? 'The torque and power columns could not be recognised; map them by hand.'
          : 'The file has neither a power nor a torque column.',
        { details: help(needs, suggestions) },
      );
    }
  }
  const used = [rpmConfidence, plan.torque ? torqueConfidence : 1, plan.power ? powerConfidence : 1];
  plan.confidence = Math.min(...used);
  if (plan.confidence < 0.5) {
    throw new AnalysisError('NEEDS_MAPPING', 'The columns could not be recognised with confidence; map them by hand.', {
      details: help(['rpm', 'torque', 'power'], { rpm: cells[plan.rpm].original }),
    });
  }
  if (rpmConfidence < 1) {
    warnings.push({ code: 'RPM_COLUMN_GUESSED', message: `Engine speed was taken from "${cells[plan.rpm].original}" by its values; check it.` });
    // A guessed rpm column with named torque/power: needs the user to confirm.
    if (rpmConfidence <= 0.5 && (torqueConfidence === 1 || powerConfidence === 1)) plan.confidence = Math.min(plan.confidence, 0.6);
  }
  if (plan.torque?.unitAssumed) warnings.push({ code: 'UNIT_ASSUMED', message: `No unit given for torque column "${cells[plan.torque.index].original}"; lb·ft assumed.` });
  if (plan.power?.unitAssumed) warnings.push({ code: 'UNIT_ASSUMED', message: `No unit given for power column "${cells[plan.power.index].original}"; hp assumed.` });
  return plan;
}

/** Largest value an engine-speed column logged in thousands can hold (20 000 rpm → 20). */
const MAX_THOUSANDS_VALUE = 25;

/**
 * Engine speed logged in thousands without a label (values 1.5–9 …): no engine turns at 25 rpm
 * or less under load, so an rpm column whose preview values all lie in (0, 25] is scaled by 1000.
 */
function settleRpmScale(plan: ColumnPlan, preview: string[][], decimalComma: boolean): void {
  if (plan.rpmScale !== 1) return;
  const vals = columnValues(preview, plan.rpm, decimalComma);
  if (vals.length < Math.min(5, preview.length) || vals.length === 0) return;
  const hi = Math.max(...vals);
  const lo = Math.min(...vals);
  if (lo >= 0 && hi >= 0.5 && hi <= MAX_THOUSANDS_VALUE) {
    plan.rpmScale = 1000;
    plan.warnings.push({
      code: 'RPM_SCALED',
      message: `Engine speed in "${plan.cells[plan.rpm].original}" reads ${lo}–${hi}: taken as thousands of rpm and multiplied by 1000.`,
    });
  }
}
