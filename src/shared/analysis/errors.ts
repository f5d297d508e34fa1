/**
 * Typed errors of the ingest engine. Every bad input ends in an {@link AnalysisError} with a
 * stable `code` (part of the API: the upload screen and the CLI switch on it), a plain-English
 * `message`, and the 1-based `line` and/or `column` header where the problem was found.
 */

/** Stable error codes. Add new ones at the end; never rename. */
export type AnalysisErrorCode =
  | 'EMPTY_FILE'
  | 'BINARY_FILE'
  | 'FILE_TOO_LARGE'
  | 'LINE_TOO_LONG'
  | 'TOO_MANY_COLUMNS'
  | 'NO_TABLE'
  | 'HEADER_ONLY'
  | 'TOO_FEW_POINTS'
  | 'NO_RPM_COLUMN'
  | 'NO_POWER_OR_TORQUE'
  | 'NEEDS_MAPPING'
  | 'MAPPING_INVALID'
  | 'NON_NUMERIC'
  | 'NO_SWEEP'
  | 'ABSURD_VALUE'
  | 'MALFORMED_CSV'
  | 'CONDITIONS_MISSING'
  | 'NO_COMMON_RANGE'
  | 'READ_FAILED'
  | 'INVALID_OPTION';

/** The only error type thrown (or rejected) by the analysis module. */
export class AnalysisError extends Error {
  /** Stable machine-readable code, see {@link AnalysisErrorCode}. */
  readonly code: AnalysisErrorCode;
  /** 1-based line of the file where the problem was found, when it applies. */
  readonly line?: number;
  /** Header text of the column where the problem was found, when it applies. */
  readonly column?: string;
  /** Extra data; for `NEEDS_MAPPING`, `NO_RPM_COLUMN` and `NO_POWER_OR_TORQUE` a {@link MappingHelp}. */
  readonly details?: unknown;

  constructor(code: AnalysisErrorCode, message: string, where: { line?: number; column?: string; details?: unknown } = {}) {
    super(message);
    this.name = 'AnalysisError';
    this.code = code;
    if (where.line !== undefined) this.line = where.line;
    if (where.column !== undefined) this.column = where.column;
    if (where.details !== undefined) this.details = where.details;
  }
}

/** Type guard usable across module copies (checks the shape, not only `instanceof`). */
export function isAnalysisError(e: unknown): e is AnalysisError {
  return e instanceof AnalysisError;
}

/**
 * Wraps anything thrown by a third-party step (csv-parse, the file system) into an AnalysisError
 * so that callers only ever see typed errors.
 */
export function toAnalysisError(e: unknown, fallbackCode: AnalysisErrorCode = 'MALFORMED_CSV', lineOffset = 0): AnalysisError {
  if (e instanceof AnalysisError) return e;
  const err = e as { code?: string; message?: string; lines?: number };
  const line = typeof err?.lines === 'number' ? err.lines + lineOffset : undefined;
  switch (err?.code) {
    case 'CSV_MAX_RECORD_SIZE':
      return new AnalysisError('LINE_TOO_LONG', 'A line of the file is longer than the line limit.', { line });
    case 'CSV_QUOTE_NOT_CLOSED':
      return new AnalysisError('MALFORMED_CSV', 'A quoted field is never closed.', { line });
    case 'CSV_INVALID_CLOSING_QUOTE':
    case 'CSV_NON_TRIMABLE_CHAR_AFTER_CLOSING_QUOTE':
      return new AnalysisError('MALFORMED_CSV', 'A quoted field is followed by unexpected characters.', { line });
    case 'ENOENT':
      return new AnalysisError('READ_FAILED', 'The file does not exist.');
    case 'EISDIR':
      return new AnalysisError('READ_FAILED', 'The path is a folder, not a file.');
    case 'EACCES':
      return new AnalysisError('READ_FAILED', 'The file cannot be read (permission denied).');
    default:
      if (typeof err?.code === 'string' && err.code.startsWith('CSV_')) {
        return new AnalysisError('MALFORMED_CSV', 'The table could not be read as delimited text.', { line });
      }
      return new AnalysisError(fallbackCode, 'The file could not be read.', { line });
  }
}
