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

/** A Float64Array that grows by doubling. */
export class GrowableSeries {
  private data = new Float64Array(1024);
  length = 0;
  push(v: number): void {
    if (this.length === this.data.length) {
      const next = new Float64Array(this.data.length * 2);
      next.set(this.data);
      this.data = next;
    }
    this.data[this.length++] = v;
  }
  /** A view of the filled part (no copy). */
  view(): Float64Array {
    return this.data.subarray(0, this.length);
  }
}

/** Accumulates the planned columns of every data record. */
export class RowCollector {
  readonly rpm = new GrowableSeries();
  readonly torque = new GrowableSeries();
  readonly power = new GrowableSeries();
  readonly afr: GrowableSeries[];
  /** Records that carried numbers. */
  numericRows = 0;
  /** Records skipped because a used cell was blank. */
  blankRows = 0;
  /** Records with no numbers at all (trailer text, repeated header) — ignored. */
  textRows = 0;
  error: AnalysisError | null = null;

  constructor(
    private readonly plan: ColumnPlan,
    private readonly decimalComma: boolean,
    /** Added to csv-parse's line numbers to give file line numbers. */
    private readonly lineOffset: number,
  ) {
    this.afr = plan.afr.map(() => new GrowableSeries());
  }

  private header(index: number): string {
    return this.plan.cells[index]?.original ?? `column ${index + 1}`;
  }

  /** Handles one record; records an error (and stops collecting) on bad input. */
  add(record: string[], csvLine: number): void {
    if (this.error) return;
    const line = csvLine + this.lineOffset;
    if (record.length > MAX_COLUMNS) {
      this.error = new AnalysisError('TOO_MANY_COLUMNS', `Line ${line} has ${record.length} fields; at most ${MAX_COLUMNS} are accepted.`, { line });
      return;
    }
    const { plan, decimalComma } = this;
    const rpmText = record[plan.rpm] ?? '';
    const rpm = parseNumber(rpmText, decimalComma);
    const tqText = plan.torque ? (record[plan.torque.index] ?? '') : '';
    const pwText = plan.power ? (record[plan.power.index] ?? '') : '';
    const tq = plan.torque ? parseNumber(tqText, decimalComma) : 0;
    const pw = plan.power ? parseNumber(pwText, decimalComma) : 0;
    if (Number.isNaN(rpm) || Number.isNaN(tq) || Number.isNaN(pw)) {
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
        this.error = new AnalysisError('NON_NUMERIC', `Line ${line}, column "${column}": "${garbage[0].slice(0, 40)}" is not a number.`, { line, column });
      } else this.blankRows++;
      return;
    }
    if (rpm < 0 || rpm > MAX_RPM) {
      const column = this.header(plan.rpm);
      this.error = new AnalysisError('ABSURD_VALUE', `Line ${line}: an engine speed of ${rpm} rpm is not plausible (0–${MAX_RPM}).`, { line, column });
      return;
    }
    if (plan.torque && Math.abs(torqueToLbft(tq, plan.torque.unit)) > MAX_TORQUE_LBFT) {
      const column = this.header(plan.torque.index);
      this.error = new AnalysisError('ABSURD_VALUE', `Line ${line}: a torque of ${tq} ${plan.torque.unit} is not plausible (over ${MAX_TORQUE_LBFT} lb·ft).`, { line, column });
      return;
    }
    if (plan.power && Math.abs(powerToHp(pw, plan.power.unit)) > MAX_POWER_HP) {
      const column = this.header(plan.power.index);
      this.error = new AnalysisError('ABSURD_VALUE', `Line ${line}: a power of ${pw} ${plan.power.unit} is not plausible (over ${MAX_POWER_HP} hp).`, { line, column });
      return;
    }
    this.numericRows++;
    this.rpm.push(rpm);
    this.torque.push(tq);
    this.power.push(pw);
    for (let k = 0; k < plan.afr.length; k++) this.afr[k].push(parseNumber(record[plan.afr[k].index] ?? '', decimalComma));
  }
}

/** csv-parse options for the data part of a file; each record goes to the collector, none are kept. */
export function csvOptions(layout: Layout, collector: RowCollector): CsvOptions {
  return {
    delimiter: layout.delimiter,
    relax_column_count: true,
    relax_quotes: true,
    skip_empty_lines: true,
    trim: true,
    bom: false,
    max_record_size: MAX_LINE_CHARS,
    on_record: (record: string[], info) => {
      collector.add(record, info.lines);
      return null;
    },
  };
}
