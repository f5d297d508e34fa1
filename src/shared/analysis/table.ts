/**
 * Row collection: csv-parse hands over each data record; the collector keeps only the columns
 * the plan uses, as numbers in growable typed arrays, so memory stays bounded by the useful data
 * (not the file text). Shared by the in-memory and the streaming reader.
 */
import type { Options as CsvOptions } from 'csv-parse';
import type { ColumnPlan } from './columns.js';
import { MAX_COLUMNS } from './columns.js';
import type { Layout } from './layout.js';
import { AnalysisError } from './errors.js';
import { parseNumber } from './numbers.js';
import { torqueToLbft, powerToHp } from './units.js';

/** Longest accepted line, in characters. */
export const MAX_LINE_CHARS = 100_000;
/** Highest plausible engine speed. */
export const MAX_RPM = 20_000;
/** Highest plausible torque, lb·ft. */
export const MAX_TORQUE_LBFT = 2_000;
/** Highest plausible power, hp. */
export const MAX_POWER_HP = 5_000;
/**
 * Numeric rows after which a non-data row (summary block, notes, a second table's header) ends the
 * data table instead of being an error.
 */
export const TABLE_END_MIN_ROWS = 10;

/**
 * A Float32Array that grows by half again (7 significant digits is ample for dyno channels and
 * halves memory on large logs). `capacity` pre-sizes it from the expected row count.
 */
export class GrowableSeries {
  private data: Float32Array;
  length = 0;
  constructor(capacity = 1024) {
    this.data = new Float32Array(Math.max(16, capacity));
  }
  push(v: number): void {
    if (this.length === this.data.length) {
      const next = new Float32Array(Math.ceil(this.data.length * 1.5));
      next.set(this.data);
      this.data = next;
    }
    this.data[this.length++] = v;
  }
  /** A view of the filled part (no copy). */
  view(): Float32Array {
    return this.data.subarray(0, this.length);
  }
}

/** Accumulates the planned columns of every data record. */
export class RowCollector {
  readonly rpm: GrowableSeries;
  readonly torque: GrowableSeries;
  readonly power: GrowableSeries;
  readonly afr: GrowableSeries[];
  /** Time channel (NaN per row when the file has none). */
  readonly time: GrowableSeries;
  /** Records seen so far (for locating a rejected one). */
  seen = 0;
  /** Builds the error once the file line of the rejected record is known. */
  pendingError: ((line: number) => AnalysisError) | null = null;
  /** Records that carried numbers. */
  numericRows = 0;
  /** Records skipped because a used cell was blank. */
  blankRows = 0;
  /** Records with no numbers at all (trailer text, repeated header) — ignored. */
  textRows = 0;
  /** Set when a non-data row after {@link TABLE_END_MIN_ROWS} numeric rows ended the table. */
  tableEnded = false;
  /** 1-based file line of the row that ended the table (filled in by the feeder). */
  tableEndLine: number | null = null;
  /** For each skipped record (blank cell or text) before the data ended: the numeric rows collected before it. */
  readonly skippedBefore: number[] = [];

  constructor(
    private readonly plan: ColumnPlan,
    private readonly decimalComma: boolean,
    expectedRows = 1024,
  ) {
    const cap = Math.ceil(expectedRows * 1.05);
    this.rpm = new GrowableSeries(cap);
    this.torque = new GrowableSeries(plan.torque ? cap : 16);
    this.power = new GrowableSeries(plan.power ? cap : 16);
    this.afr = plan.afr.map(() => new GrowableSeries(cap));
    this.time = new GrowableSeries(plan.time !== null ? cap : 16);
    this.rpmScale = plan.rpmScale;
  }

  private readonly rpmScale: number;

  /** 0-based record (data row) index of collected sample `i`, counting skipped records. */
  recordIndexOf(i: number): number {
    let r = i;
    for (const s of this.skippedBefore) if (s <= i) r++;
    return r;
  }

  /** True when a non-numeric record is not shaped like a data row (so it ends the table). */
  private endsTable(record: string[], rpmText: string): boolean {
    if (this.numericRows < TABLE_END_MIN_ROWS) return false;
    if (rpmText.length > 0 && Number.isNaN(parseNumber(rpmText, this.decimalComma))) return true;
    let numeric = 0;
    let nonEmpty = 0;
    for (const f of record) {
      if (f.length === 0) continue;
      nonEmpty++;
      if (!Number.isNaN(parseNumber(f, this.decimalComma))) numeric++;
    }
    return numeric === 0 || numeric < 0.6 * nonEmpty;
  }

  /** Sink for {@link BlockFeeder}: adds records, returns the index of a rejected one or -1. */
  addAll(records: string[][]): number {
    for (let i = 0; i < records.length; i++) {
      this.add(records[i]);
      if (this.pendingError || this.tableEnded) return i;
    }
    return -1;
  }

  private header(index: number): string {
    return this.plan.cells[index]?.original ?? `column ${index + 1}`;
  }

  /** Handles one record; records an error (and stops collecting) on bad input. */
  add(record: string[]): void {
    if (this.pendingError || this.tableEnded) return;
    this.seen++;
    if (record.length > MAX_COLUMNS) {
      const n = record.length;
      this.pendingError = (line) => new AnalysisError('TOO_MANY_COLUMNS', `Line ${line} has ${n} fields; at most ${MAX_COLUMNS} are accepted.`, { line });
      return;
    }
    const { plan, decimalComma } = this;
    const rpmText = record[plan.rpm] ?? '';
    const rpmRead = parseNumber(rpmText, decimalComma);
    const rpm = this.rpmScale === 1 ? rpmRead : rpmRead * this.rpmScale;
    const tqText = plan.torque ? (record[plan.torque.index] ?? '') : '';
    const pwText = plan.power ? (record[plan.power.index] ?? '') : '';
    const tq = plan.torque ? parseNumber(tqText, decimalComma) : 0;
    const pw = plan.power ? parseNumber(pwText, decimalComma) : 0;
    if (Number.isNaN(rpm) || Number.isNaN(tq) || Number.isNaN(pw)) {
      if (this.endsTable(record, rpmText)) {
        this.tableEnded = true;
        return;
      }
      this.skippedBefore.push(this.numericRows);
      if (!record.some((f) => f.length > 0 && !Number.isNaN(parseNumber(f, decimalComma)))) {
        this.textRows++;
        return;
      }
      const bad: [string, number][] = [[rpmText, plan.rpm]];
      if (plan.torque) bad.push([tqText, plan.torque.index]);
      if (plan.power) bad.push([pwText, plan.power.index]);
      const garbage = bad.find(([text]) => text.length > 0 && Number.isNaN(parseNumber(text, decimalComma)));
      if (garbage) {
        const column = this.header(garbage[1]);
        this.pendingError = (line) => new AnalysisError('NON_NUMERIC', `Line ${line}, column "${column}": "${garbage[0].slice(0, 40)}" is not a number.`, { line, column });
      } else this.blankRows++;
      return;
    }
    if (rpm < 0 || rpm > MAX_RPM) {
      const column = this.header(plan.rpm);
      this.pendingError = (line) => new AnalysisError('ABSURD_VALUE', `Line ${line}: an engine speed of ${this.rpmScale === 1 ? rpm : `${rpmText} × ${this.rpmScale}`} rpm is not plausible (0–${MAX_RPM}).`, { line, column });
      return;
    }
    if (plan.torque && Math.abs(torqueToLbft(tq, plan.torque.unit)) > MAX_TORQUE_LBFT) {
      const column = this.header(plan.torque.index);
      const unit = plan.torque.unit;
      this.pendingError = (line) => new AnalysisError('ABSURD_VALUE', `Line ${line}: a torque of ${tq} ${unit} is not plausible (over ${MAX_TORQUE_LBFT} lb·ft).`, { line, column });
      return;
    }
    if (plan.power && Math.abs(powerToHp(pw, plan.power.unit)) > MAX_POWER_HP) {
      const column = this.header(plan.power.index);
      const unit = plan.power.unit;
      this.pendingError = (line) => new AnalysisError('ABSURD_VALUE', `Line ${line}: a power of ${pw} ${unit} is not plausible (over ${MAX_POWER_HP} hp).`, { line, column });
      return;
    }
    this.numericRows++;
    this.rpm.push(rpm);
    this.torque.push(tq);
    this.power.push(pw);
    if (plan.time !== null) this.time.push(parseNumber(record[plan.time] ?? '', decimalComma));
    for (let k = 0; k < plan.afr.length; k++) this.afr[k].push(parseNumber(record[plan.afr[k].index] ?? '', decimalComma));
  }
}

/** csv-parse options for the data part of a file (UTF-8 bytes). */
export function csvOptions(layout: Layout): CsvOptions {
  return {
    delimiter: layout.delimiter,
    relax_column_count: true,
    relax_quotes: true,
    skip_empty_lines: true,
    trim: true,
    bom: false,
    max_record_size: MAX_LINE_CHARS,
  };
}
