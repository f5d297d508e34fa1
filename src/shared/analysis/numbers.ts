/**
 * Number parsing for dyno tables: decimal point or decimal comma, thousands separators inside
 * quoted numbers ("5,012" in a comma file, "1.234,5" in a decimal-comma file). Returns NaN for
 * anything that is not a plain finite number (hex, "Infinity", text, blanks).
 */

const PLAIN_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const THOUSANDS_COMMA = /^[+-]?\d{1,3}(,\d{3})+(\.\d+)?$/;
const DECIMAL_COMMA = /^[+-]?\d*,\d+$|^[+-]?\d+,$/;
const THOUSANDS_DOT_DECIMAL_COMMA = /^[+-]?\d{1,3}(\.\d{3})+(,\d+)?$/;

/** Parses one field. `decimalComma` selects the file's decimal separator. */
export function parseNumber(raw: string, decimalComma: boolean): number {
  const s = raw.length > 0 && (raw.charCodeAt(0) === 32 || raw.charCodeAt(raw.length - 1) === 32) ? raw.trim() : raw;
  if (s.length === 0) return NaN;
  const c = s.charCodeAt(0);
  // Fast reject: a number starts with a digit, sign or point.
  if (!((c >= 48 && c <= 57) || c === 45 || c === 43 || c === 46 || c === 44)) return NaN;
  if (!decimalComma) {
    if (PLAIN_NUMBER.test(s)) return Number(s);
    if (THOUSANDS_COMMA.test(s)) return Number(s.replace(/,/g, ''));
    return NaN;
  }
  if (DECIMAL_COMMA.test(s)) return Number(s.replace(',', '.'));
  if (THOUSANDS_DOT_DECIMAL_COMMA.test(s) && s.includes(',')) return Number(s.replace(/\./g, '').replace(',', '.'));
  if (PLAIN_NUMBER.test(s)) return Number(s);
  return NaN;
}

/** True when the field parses as a number under either convention (used while sniffing layout). */
export function looksNumeric(s: string): boolean {
  return !Number.isNaN(parseNumber(s, false)) || !Number.isNaN(parseNumber(s, true));
}
