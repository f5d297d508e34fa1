/**
 * Layout sniffing: which delimiter, which decimal separator, where the preamble ends, which line
 * is the header (and an optional units row), where the data starts. Works on the first part of
 * the file only, so large files can be streamed afterwards.
 */
import { DELIMITERS, type Delimiter, type SourceLine, splitFields, splitLines } from './delimiter.js';
import { AnalysisError } from './errors.js';
import { MAX_COLUMNS } from './columns.js';
import { isUnitsRow } from './header.js';
import { looksNumeric, parseNumber } from './numbers.js';

/** Lines of the head inspected for the layout. */
export const SNIFF_LINES = 400;

/** The layout of a run file. */
export interface Layout {
  delimiter: Delimiter;
  decimalComma: boolean;
  /** Raw preamble lines (before the header). */
  preamble: SourceLine[];
  /** Header cells, or null when the table has no header row. */
  header: string[] | null;
  /** Units-only second header row, when present. */
  unitsRow: string[] | null;
  /** Character offset in the text where data rows start. */
  dataStart: number;
  /** 1-based line number of the first data row. */
  dataStartLine: number;
  /** Fields per data row. */
  fieldCount: number;
  /** The first data rows, split (for value plausibility and the mapping preview). */
  preview: string[][];
}

interface Candidate {
  delimiter: Delimiter;
  runStart: number;
  runLength: number;
  fieldCount: number;
}

function isDataRow(fields: string[], delimiter: Delimiter): boolean {
  if (fields.length < 2) return false;
  let numeric = 0;
  let nonEmpty = 0;
  for (const f of fields) {
    if (f.length === 0) continue;
    nonEmpty++;
    const ok = delimiter === ',' ? !Number.isNaN(parseNumber(f, false)) : looksNumeric(f);
    if (ok) numeric++;
  }
  return numeric >= 2 && numeric >= 0.6 * nonEmpty;
}

function bestRun(lines: SourceLine[], delimiter: Delimiter): Candidate | null {
  // Runs of consecutive data rows (blank lines skipped) with the same field count.
  const runs: Candidate[] = [];
  let current: Candidate | null = null;
  for (let i = 0; i < lines.length; i++) {
    const text = lines[i].text;
    if (text.trim().length === 0) continue;
    const fields = splitFields(text, delimiter);
    if (isDataRow(fields, delimiter)) {
      if (current && current.fieldCount === fields.length) current.runLength++;
      else {
        current = { delimiter, runStart: i, runLength: 1, fieldCount: fields.length };
        runs.push(current);
      }
    } else current = null;
  }
  if (runs.length === 0) return null;
  const longest = Math.max(...runs.map((r) => r.runLength));
  // The first run that is reasonably long: a stray numeric preamble line is not the table.
  return runs.find((r) => r.runLength >= Math.min(3, longest)) ?? null;
}

/**
 * Sniffs the layout from the head of a file. `complete` says whether `head` is the whole file.
 * Throws `EMPTY_FILE`, `NO_TABLE` or `HEADER_ONLY`.
 */
export function detectLayout(head: string, complete: boolean): Layout {
  const lines = splitLines(head, complete, SNIFF_LINES);
  if (lines.every((l) => l.text.trim().length === 0)) {
    // Text but not one whole line in the head: a row far wider than a run file has.
    const widest = Math.max(...DELIMITERS.map((d) => head.split(d).length));
    if (!complete && widest > MAX_COLUMNS) throw new AnalysisError('TOO_MANY_COLUMNS', `The first line has more than ${widest - 1} columns before it even ends; at most ${MAX_COLUMNS} are accepted.`);
    throw new AnalysisError('EMPTY_FILE', 'The file is empty.');
  }

  let best: Candidate | null = null;
  for (const d of DELIMITERS) {
    const c = bestRun(lines, d);
    if (!c) continue;
    const score = c.runLength * c.fieldCount;
    if (!best || score > best.runLength * best.fieldCount) best = c;
  }
  if (!best) {
    const nonBlank = lines.filter((l) => l.text.trim().length > 0);
    const last = nonBlank[nonBlank.length - 1];
    const looksLikeHeader = nonBlank.length <= 3 && DELIMITERS.some((d) => splitFields(last.text, d).length >= 2);
    if (looksLikeHeader) throw new AnalysisError('HEADER_ONLY', 'The file has a header but no data rows.', { line: last.line });
    throw new AnalysisError('NO_TABLE', 'No table of numbers was found in the file.');
  }

  const { delimiter } = best;
  let cursor = best.runStart - 1;
  const previousNonBlank = (): number => {
    while (cursor >= 0 && lines[cursor].text.trim().length === 0) cursor--;
    return cursor;
  };
  let unitsRow: string[] | null = null;
  let header: string[] | null = null;
  let preambleEnd = best.runStart;
  let i = previousNonBlank();
  if (i >= 0) {
    const cells = splitFields(lines[i].text, delimiter);
    if (isUnitsRow(cells)) {
      unitsRow = cells;
      preambleEnd = i;
      cursor = i - 1;
      i = previousNonBlank();
    }
  }
  if (i >= 0) {
    const cells = splitFields(lines[i].text, delimiter);
    const textual = cells.filter((c) => c.length > 0 && !looksNumeric(c)).length;
    if (cells.length >= 2 && cells.length >= best.fieldCount - 1 && textual >= 0.5 * cells.length) {
      header = cells;
      preambleEnd = i;
    }
  }
  if (unitsRow && !header) {
    // A units row without names: use the units as names so the columns can still be recognised.
    header = unitsRow;
    unitsRow = null;
  }

  const dataLines = lines.slice(best.runStart).filter((l) => l.text.trim().length > 0);
  const preview = dataLines.slice(0, 200).map((l) => splitFields(l.text, delimiter));
  let decimalComma = false;
  if (delimiter !== ',') {
    let commaDecimals = 0;
    let dotDecimals = 0;
    for (const row of preview) {
      for (const f of row) {
        if (/^[+-]?\d*,\d+$/.test(f)) commaDecimals++;
        else if (/^[+-]?\d*\.\d+$/.test(f)) dotDecimals++;
      }
    }
    decimalComma = commaDecimals > dotDecimals;
  }
  const first = lines[best.runStart];
  return {
    delimiter,
    decimalComma,
    preamble: lines.slice(0, preambleEnd).filter((l) => l.text.trim().length > 0),
    header,
    unitsRow,
    dataStart: first.start,
    dataStartLine: first.line,
    fieldCount: best.fieldCount,
    preview,
  };
}
