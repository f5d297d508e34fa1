/**
 * Line and field splitting used while sniffing a file's layout (the table itself is then parsed by
 * csv-parse). Handles CRLF, LF and CR line ends and double-quoted fields.
 */

/** Field delimiters the reader detects. */
export const DELIMITERS = [',', ';', '\t', '|'] as const;
/** One of {@link DELIMITERS}. */
export type Delimiter = (typeof DELIMITERS)[number];

/** A line of the sniffed head with its position. */
export interface SourceLine {
  text: string;
  /** 1-based line number. */
  line: number;
  /** Character offset of the start of the line in the text. */
  start: number;
}

/**
 * Splits text into lines on CRLF, LF or CR. When `complete` is false the last (possibly cut)
 * line is left out.
 */
export function splitLines(text: string, complete: boolean, maxLines = Infinity): SourceLine[] {
  const out: SourceLine[] = [];
  const re = /\r\n|\n|\r/g;
  let start = 0;
  let line = 1;
  let m: RegExpExecArray | null;
  while ((m = re.exec(text)) !== null && out.length < maxLines) {
    // A lone CR at the very end of an incomplete chunk may be the first half of CRLF.
    if (!complete && m[0] === '\r' && m.index === text.length - 1) break;
    out.push({ text: text.slice(start, m.index), line, start });
    start = m.index + m[0].length;
    line++;
  }
  if (complete && start < text.length && out.length < maxLines) out.push({ text: text.slice(start), line, start });
  return out;
}

/** Splits one line into fields, honouring double quotes ("" inside quotes is a literal quote). */
export function splitFields(line: string, delimiter: string): string[] {
  if (!line.includes('"')) return line.split(delimiter).map((f) => f.trim());
  const fields: string[] = [];
  let field = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i];
    if (quoted) {
      if (ch === '"') {
        if (line[i + 1] === '"') {
          field += '"';
          i++;
        } else quoted = false;
      } else field += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === delimiter) {
      fields.push(field.trim());
      field = '';
    } else field += ch;
  }
  fields.push(field.trim());
  return fields;
}
