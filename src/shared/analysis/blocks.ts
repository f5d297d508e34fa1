/**
 * Feeds UTF-8 bytes to csv-parse in blocks cut at line ends (outside quotes). Each block is
 * parsed with csv-parse's sync API and its records handed on at once — measurably faster than a
 * per-record callback — and memory stays bounded by the block size. Line numbers are counted
 * per block and, only when a record is rejected, recovered exactly by re-parsing that block.
 */
import { parse as parseCsvSync } from 'csv-parse/sync';
import type { Options as CsvOptions } from 'csv-parse';
import { AnalysisError, toAnalysisError } from './errors.js';

/** Bytes parsed per block. */
export const BLOCK_BYTES = 128 * 1024;

/** Receives a block's records; returns the index of a rejected record, or -1. */
export type RecordSink = (records: string[][]) => number;

/** Counts line ends (LF, CRLF, lone CR) in bytes. Without CR it is a native memchr loop. */
function countLines(b: Uint8Array): number {
  let n = 0;
  if (b.indexOf(13) < 0) {
    for (let i = b.indexOf(10); i >= 0; i = b.indexOf(10, i + 1)) n++;
    return n;
  }
  for (let i = 0; i < b.length; i++) {
    const c = b[i];
    if (c === 10) n++;
    else if (c === 13 && b[i + 1] !== 10) n++;
  }
  return n;
}

/** Index just after the last line end in `b` with an even number of quotes before it, or -1. */
function safeCut(b: Uint8Array): number {
  let cut = -1;
  if (b.indexOf(34) < 0) {
    // No quotes (the usual case): the last line end, found natively.
    cut = Math.max(b.lastIndexOf(10), b.lastIndexOf(13)) + 1 || -1;
  } else {
    let quotes = 0;
    for (let i = 0; i < b.length; i++) {
      const c = b[i];
      if (c === 34) quotes++;
      else if ((c === 10 || c === 13) && (quotes & 1) === 0) cut = i + 1;
    }
  }
  // A CR at the very end may be half of CRLF: cut before it.
  if (cut === b.length && b[b.length - 1] === 13) cut = b.length - 1;
  return cut;
}

const utf8 = new TextDecoder('utf-8', { fatal: false, ignoreBOM: true });

/** True for the characters csv-parse's `trim` removes around a field (space, tab, form feed). */
function isTrimmable(c: number): boolean {
  return c === 32 || c === 9 || c === 12;
}

/**
 * Fast path for the usual block (UTF-8, LF line ends, no quotes, no CR): splits lines and fields
 * natively, giving exactly the records csv-parse gives with {@link csvOptions} (empty lines
 * skipped, fields trimmed of spaces, tabs and form feeds, ragged rows kept). Returns null when the
 * block needs the full parser: a quote, a CR, a whitespace-only line, a line over `maxLineChars`,
 * or a delimiter other than one character.
 */
export function fastRecords(block: Uint8Array, delimiter: string, maxLineChars: number): string[][] | null {
  if (delimiter.length !== 1 || block.indexOf(34) >= 0 || block.indexOf(13) >= 0) return null;
  const text = utf8.decode(block);
  const lines = text.split('\n');
  const records: string[][] = [];
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i];
    if (line.length === 0) continue;
    if (line.length > maxLineChars) return null;
    const fields = line.split(delimiter);
    for (let j = 0; j < fields.length; j++) {
      const f = fields[j];
      if (f.length > 0 && (isTrimmable(f.charCodeAt(0)) || isTrimmable(f.charCodeAt(f.length - 1)))) {
        let a = 0;
        let b = f.length;
        while (a < b && isTrimmable(f.charCodeAt(a))) a++;
        while (b > a && isTrimmable(f.charCodeAt(b - 1))) b--;
        fields[j] = f.slice(a, b);
      }
    }
    if (fields.length === 1 && fields[0].length === 0) return null;
    records.push(fields);
  }
  return records;
}

/** Incremental block parser. */
export class BlockFeeder {
  private carry: Uint8Array = new Uint8Array(0);
  private line: number;
  stopped = false;

  constructor(
    private readonly options: CsvOptions,
    private readonly sink: RecordSink,
    /** Resolves a rejected record to an error once its line is known; null ends the table quietly. */
    private readonly rejected: (line: number) => AnalysisError | null,
    firstLine: number,
    private readonly maxLineBytes: number,
  ) {
    this.line = firstLine;
  }

  /** Adds bytes; parses every complete line. */
  push(bytes: Uint8Array): void {
    if (this.stopped) return;
    let buf: Uint8Array = bytes;
    if (this.carry.length > 0) {
      buf = new Uint8Array(this.carry.length + bytes.length);
      buf.set(this.carry);
      buf.set(bytes, this.carry.length);
    }
    const cut = safeCut(buf);
    if (cut <= 0) {
      // Keep a copy: the caller may reuse its buffer.
      this.carry = buf === bytes ? bytes.slice() : buf;
      if (buf.length > this.maxLineBytes && !buf.includes(34)) {
        throw new AnalysisError('LINE_TOO_LONG', 'A line of the file is longer than the line limit.', { line: this.line });
      }
      return;
    }
    this.carry = buf.slice(cut);
    this.parseBlock(buf.subarray(0, cut));
  }

  /** Parses what is left. */
  end(): void {
    if (this.stopped || this.carry.length === 0) return;
    const rest = this.carry;
    this.carry = new Uint8Array(0);
    this.parseBlock(rest);
  }

  private parseBlock(block: Uint8Array): void {
    let records: string[][] | null;
    try {
      records = fastRecords(block, String(this.options.delimiter ?? ','), Number(this.options.max_record_size ?? Infinity));
      records ??= parseCsvSync(block, this.options) as string[][];
    } catch (e) {
      throw toAnalysisError(e, 'MALFORMED_CSV', this.line - 1);
    }
    const bad = this.sink(records);
    if (bad >= 0) {
      this.stopped = true;
      const withInfo = parseCsvSync(block, { ...this.options, info: true }) as unknown as { info: { lines: number } }[];
      const error = this.rejected(this.line + (withInfo[bad]?.info.lines ?? 1) - 1);
      if (error) throw error;
      return;
    }
    this.line += countLines(block);
  }
}
