/**
 * Display formatting for numbers, units, money and dates.
 *
 * Pure functions over plain values; every one returns {@link MISSING} for null, undefined, NaN or
 * ±Infinity so a screen never shows "NaN hp". Rounding follows Intl.NumberFormat (ECMA-402
 * "halfExpand": 0.05 → 0.1, −0.05 → −0.1). Negative numbers use the true minus sign U+2212, which
 * lines up with "+" in tabular figures; Barlow ships that glyph in its latin subset.
 */

/** Shown in place of a value that is missing or not a finite number. */
export const MISSING = '—';

/** The minus sign used for negative values (U+2212), not the hyphen-minus. */
export const MINUS = '\u2212';

/**
 * Value and unit are joined by a plain space so strings match what people type and search for;
 * components that must not wrap them use `whitespace-nowrap`.
 */
const UNIT_SPACE = ' ';

const DEFAULT_LOCALE = 'en-US';

export type Numeric = number | null | undefined;

export interface NumberOptions {
  /** Fixed number of decimals (default 0). */
  decimals?: number;
  /** Prefix "+" on positive values. Values that round to zero never get a sign. */
  signed?: boolean;
  /** Group thousands ("4,800"); default true. */
  grouping?: boolean;
  locale?: string;
}

const formatterCache = new Map<string, Intl.NumberFormat>();

function numberFormatter(locale: string, options: Intl.NumberFormatOptions): Intl.NumberFormat {
  const key = `${locale}|${JSON.stringify(options)}`;
  let formatter = formatterCache.get(key);
  if (!formatter) {
    formatter = new Intl.NumberFormat(locale, options);
    formatterCache.set(key, formatter);
  }
  return formatter;
}

function isFiniteNumber(value: Numeric): value is number {
  return typeof value === 'number' && Number.isFinite(value);
}

function withUnit(text: string, unit: string | undefined): string {
  if (!unit || text === MISSING) return text;
  return `${text}${UNIT_SPACE}${unit}`;
}

/** A number with fixed decimals and thousands separators: `formatNumber(4800) → "4,800"`. */
export function formatNumber(value: Numeric, options: NumberOptions = {}): string {
  if (!isFiniteNumber(value)) return MISSING;
  const { decimals = 0, signed = false, grouping = true, locale = DEFAULT_LOCALE } = options;
  const text = numberFormatter(locale, {
    minimumFractionDigits: decimals,
    maximumFractionDigits: decimals,
    useGrouping: grouping,
    // "exceptZero" also drops the sign from values that round to zero, so −0.04 shows as "0.0".
    signDisplay: signed ? 'exceptZero' : 'negative',
  }).format(value);
  return text.replace('-', MINUS);
}

/** A number followed by its unit: `formatQuantity(98.24, 'lb·ft', 1) → "98.2 lb·ft"`. */
export function formatQuantity(value: Numeric, unit: string, decimals = 1, options: Omit<NumberOptions, 'decimals'> = {}): string {
  return withUnit(formatNumber(value, { ...options, decimals }), unit);
}

export type PowerUnit = 'hp' | 'kW' | 'PS';
export type TorqueUnit = 'lb·ft' | 'N·m';

/** Horsepower with one decimal: `formatHp(112.44) → "112.4 hp"`. */
export function formatHp(value: Numeric, decimals = 1): string {
  return formatQuantity(value, 'hp', decimals);
}

/** Power in any of the units we show. */
export function formatPower(value: Numeric, unit: PowerUnit = 'hp', decimals = 1): string {
  return formatQuantity(value, unit, decimals);
}

/** Torque with one decimal: `formatTorque(98.24) → "98.2 lb·ft"`. */
export function formatTorque(value: Numeric, unit: TorqueUnit = 'lb·ft', decimals = 1): string {
  return formatQuantity(value, unit, decimals);
}

/**
 * A signed change with its unit: `formatGain(6.1) → "+6.1 hp"`, `formatGain(-2) → "−2.0 hp"`.
 * A change that rounds to zero shows unsigned ("0.0 hp"), never "+0.0" or "−0.0".
 */
export function formatGain(delta: Numeric, unit = 'hp', decimals = 1): string {
  return withUnit(formatNumber(delta, { decimals, signed: true }), unit);
}

/**
 * A fraction as a percentage: `formatPercent(0.062) → "6.2%"`. Takes a ratio (0–1), not a
 * percentage, so values computed as gain / baseline can be passed straight in.
 */
export function formatPercent(fraction: Numeric, decimals = 1, options: Pick<NumberOptions, 'signed' | 'locale'> = {}): string {
  if (!isFiniteNumber(fraction)) return MISSING;
  const percent = fraction * 100;
  // Scale first, then round, so 0.0625 becomes 6.3% rather than suffering binary drift in Intl's percent style.
  return `${formatNumber(Number(percent.toFixed(10)), { ...options, decimals })}%`;
}

/** A signed percentage: `formatPercentChange(0.054) → "+5.4%"`. */
export function formatPercentChange(fraction: Numeric, decimals = 1): string {
  return formatPercent(fraction, decimals, { signed: true });
}

/** Engine speed, whole rpm with thousands separators: `formatRpm(4800) → "4,800 rpm"`. */
export function formatRpm(value: Numeric): string {
  return withUnit(formatNumber(value, { decimals: 0 }), 'rpm');
}

/** An rpm range: `formatRpmRange(3000, 5500) → "3,000–5,500 rpm"`. */
export function formatRpmRange(from: Numeric, to: Numeric): string {
  if (!isFiniteNumber(from) || !isFiniteNumber(to)) return MISSING;
  return withUnit(`${formatNumber(from)}–${formatNumber(to)}`, 'rpm');
}

export interface MoneyOptions {
  /** ISO 4217 code; default USD. */
  currency?: string;
  /** The amount is in minor units (cents) rather than major units. */
  minorUnits?: boolean;
  /** Drop the cents when the amount is whole ("$1,250" rather than "$1,250.00"). */
  wholeUnits?: boolean;
  locale?: string;
}

/** Money: `formatMoney(1250) → "$1,250.00"`, `formatMoney(125000, { minorUnits: true }) → "$1,250.00"`. */
export function formatMoney(amount: Numeric, options: MoneyOptions = {}): string {
  if (!isFiniteNumber(amount)) return MISSING;
  const { currency = 'USD', minorUnits = false, wholeUnits = false, locale = DEFAULT_LOCALE } = options;
  const formatter = numberFormatter(locale, { style: 'currency', currency });
  const fractionDigits = formatter.resolvedOptions().maximumFractionDigits ?? 2;
  const major = minorUnits ? amount / 10 ** fractionDigits : amount;
  const digits = wholeUnits ? 0 : fractionDigits;
  return numberFormatter(locale, {
    style: 'currency',
    currency,
    minimumFractionDigits: digits,
    maximumFractionDigits: digits,
  })
    .format(major)
    .replace('-', MINUS);
}

/**
 * What each horsepower of gain cost: `formatCostPerHp(1250, 6.1) → "$205 per hp"`.
 * Shows {@link MISSING} when there was no gain, because a cost per horsepower of a loss means nothing.
 */
export function formatCostPerHp(cost: Numeric, gainHp: Numeric, options: Omit<MoneyOptions, 'wholeUnits'> = {}): string {
  if (!isFiniteNumber(cost) || !isFiniteNumber(gainHp) || gainHp <= 0) return MISSING;
  return `${formatMoney(cost / gainHp, { ...options, wholeUnits: true })} per hp`;
}

export type DateInput = Date | string | number | null | undefined;

/** A date-only string ("2025-03-12") is a calendar day, not UTC midnight; parse it as local time. */
const DATE_ONLY = /^(\d{4})-(\d{2})-(\d{2})$/;

/** Parse a date-like value; returns null when it is missing or not a valid date. */
export function toDate(input: DateInput): Date | null {
  if (input === null || input === undefined || input === '') return null;
  if (input instanceof Date) return Number.isNaN(input.getTime()) ? null : input;
  if (typeof input === 'string') {
    const dateOnly = DATE_ONLY.exec(input);
    if (dateOnly) {
      const [, y, m, d] = dateOnly;
      return new Date(Number(y), Number(m) - 1, Number(d));
    }
  }
  const date = new Date(input);
  return Number.isNaN(date.getTime()) ? null : date;
}

export interface DateOptions {
  locale?: string;
  /** IANA zone; defaults to the browser's. Tests pass "UTC". */
  timeZone?: string;
}

/** A calendar date: `formatDate('2025-03-12') → "Mar 12, 2025"`. */
export function formatDate(input: DateInput, options: DateOptions = {}): string {
  const date = toDate(input);
  if (!date) return MISSING;
  const { locale = DEFAULT_LOCALE, timeZone } = options;
  const zone = typeof input === 'string' && DATE_ONLY.test(input) ? undefined : timeZone;
  return new Intl.DateTimeFormat(locale, { year: 'numeric', month: 'short', day: 'numeric', timeZone: zone }).format(date);
}

/** Date and time: `formatDateTime('2025-03-12T14:05:00Z', { timeZone: 'UTC' }) → "Mar 12, 2025, 2:05 PM"`. */
export function formatDateTime(input: DateInput, options: DateOptions = {}): string {
  const date = toDate(input);
  if (!date) return MISSING;
  const { locale = DEFAULT_LOCALE, timeZone } = options;
  return new Intl.DateTimeFormat(locale, {
    year: 'numeric',
    month: 'short',
    day: 'numeric',
    hour: 'numeric',
    minute: '2-digit',
    timeZone,
  }).format(date);
}

/** A machine-readable value for `<time dateTime>`: the ISO string, or undefined when missing. */
export function toDateTimeAttr(input: DateInput): string | undefined {
  return toDate(input)?.toISOString();
}

/** File sizes in decimal units as operating systems show them: `formatFileSize(1_250_000) → "1.3 MB"`. */
export function formatFileSize(bytes: Numeric): string {
  if (!isFiniteNumber(bytes) || bytes < 0) return MISSING;
  if (bytes < 1000) return withUnit(formatNumber(bytes), bytes === 1 ? 'byte' : 'bytes');
  const units = ['kB', 'MB', 'GB', 'TB'];
  let value = bytes / 1000;
  let unit = 0;
  while (value >= 999.95 && unit < units.length - 1) {
    value /= 1000;
    unit += 1;
  }
  return withUnit(formatNumber(value, { decimals: 1 }), units[unit]);
}

/** A count with a noun that agrees with it: `formatCount(1, 'run') → "1 run"`, `formatCount(3, 'run') → "3 runs"`. */
export function formatCount(count: Numeric, singular: string, plural = `${singular}s`): string {
  if (!isFiniteNumber(count)) return MISSING;
  return `${formatNumber(count)} ${count === 1 ? singular : plural}`;
}
