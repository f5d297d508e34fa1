/**
 * Header-row handling: names with units in brackets or parentheses (`Torque [Nm]`,
 * `Power (hp)`), unit suffixes (`tq_ftlb`), and a second header row holding only units.
 */

/** A header cell split into a normalised name and an optional unit text. */
export interface HeaderCell {
  /** The header text as it appears in the file (used as the column's name everywhere). */
  original: string;
  /** Lower-case name with punctuation collapsed to single spaces, unit removed. */
  name: string;
  /** Unit text from brackets, parentheses or the units row, lower-case; '' when none. */
  unit: string;
  /** `name` with accents folded first (`régime` → `regime`), for matching only (not in the signature). */
  key: string;
}

/** Folds accented Latin letters to their base letter (NFD, combining marks removed; ß → ss). */
export function foldAccents(text: string): string {
  return text.normalize('NFD').replace(/[\u0300-\u036f]/g, '').replace(/ß/g, 'ss');
}

const UNIT_IN_BRACKETS = /^(.*?)[\s_]*[[(]([^\])]*)[\])]\s*$/;

/** Normalises a name for matching: lower case, non-alphanumerics → single spaces. */
export function normaliseName(text: string): string {
  return text
    .toLowerCase()
    .replace(/λ/g, 'lambda')
    .replace(/[^a-z0-9%]+/g, ' ')
    .trim();
}

/** Splits `Torque [Nm]` into name `torque` and unit `nm`. */
export function parseHeaderCell(original: string, unitRowCell?: string): HeaderCell {
  const m = UNIT_IN_BRACKETS.exec(original);
  let name = original;
  let unit = '';
  if (m && m[1].trim().length > 0) {
    name = m[1];
    unit = m[2];
  }
  if (!unit && unitRowCell) unit = unitRowCell.replace(/^[[(]|[\])]$/g, '');
  return { original, name: normaliseName(name), unit: unit.trim().toLowerCase(), key: normaliseName(foldAccents(name)) };
}

const UNIT_TOKENS = new Set([
  'rpm', '1/min', 'min-1', 'min^-1', 'rev/min', 'u/min', 'r/min', 'tr/min', 'giri/min', 'rpm x1000', 'x1000 rpm', 'krpm', 'x1000',
  'ft-lb', 'ft-lbs', 'lb-ft', 'lbs-ft', 'ftlb', 'ftlbs', 'lbft', 'lb·ft', 'lbf·ft', 'lbf ft', 'ft lb', 'lb ft', 'ft.lb', 'lb.ft',
  'nm', 'n.m', 'n·m', 'n-m', 'n m', 'kgm', 'kgfm', 'kgf·m', 'kgf.m', 'mkg',
  'hp', 'bhp', 'whp', 'kw', 'ps', 'cv',
  'mph', 'km/h', 'kph', 'kmh', 'm/s',
  's', 'sec', 'secs', 'ms', 'seconds',
  '°c', 'degc', 'c', '°f', 'degf', 'f', 'k', 'deg c', 'deg f', '° c', '° f',
  'kpa', 'psi', 'psia', 'bar', 'mbar', 'hpa', 'inhg', 'in hg', 'mmhg',
  'afr', 'a/f', 'lambda', 'λ', '%', 'v', 'deg', '-', 'ratio',
]);

/** True when a cell holds nothing but a unit (used to recognise a units-only second header row). */
export function isUnitToken(cell: string): boolean {
  const t = cell.trim().toLowerCase().replace(/^[[(]\s*|\s*[\])]$/g, '');
  return UNIT_TOKENS.has(t);
}

/** True when every non-empty cell of the row is a unit and there are at least two. */
export function isUnitsRow(cells: string[]): boolean {
  const nonEmpty = cells.filter((c) => c.trim().length > 0);
  return nonEmpty.length >= 2 && nonEmpty.every(isUnitToken);
}

/**
 * Stable string identifying a file layout: the normalised header names with their units, in
 * order. The same dyno PC exporting the same way always gives the same signature.
 */
export function headerSignature(cells: HeaderCell[]): string {
  return cells.map((c) => (c.unit ? `${c.name.replace(/ /g, '_')}[${c.unit.replace(/\s+/g, '')}]` : c.name.replace(/ /g, '_'))).join('|');
}
