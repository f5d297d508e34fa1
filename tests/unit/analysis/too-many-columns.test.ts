import { describe, expect, it } from 'vitest';
import { analyzeBuffer, AnalysisError, MAX_COLUMNS } from '@shared/analysis';

const codeOf = (fn: () => unknown) => {
  try {
    fn();
  } catch (e) {
    return e instanceof AnalysisError ? e.code : `not an AnalysisError: ${String(e)}`;
  }
  return 'no error';
};

describe('a file far wider than a run file', () => {
  it('answers TOO_MANY_COLUMNS for a million columns, not "the file is empty"', () => {
    const header = Array.from({ length: 1_000_000 }, (_, i) => `c${i}`).join(',');
    const row = Array.from({ length: 1_000_000 }, () => '1').join(',');
    expect(codeOf(() => analyzeBuffer(new TextEncoder().encode(`${header}\n${row}\n${row}\n`)))).toBe('TOO_MANY_COLUMNS');
  });

  it('still answers EMPTY_FILE for a file of blank lines', () => {
    expect(codeOf(() => analyzeBuffer(new TextEncoder().encode('\n\n   \n')))).toBe('EMPTY_FILE');
  });

  it('keeps the existing limit for a header that fits the head', () => {
    const header = Array.from({ length: MAX_COLUMNS + 5 }, (_, i) => `c${i}`).join(',');
    const row = Array.from({ length: MAX_COLUMNS + 5 }, () => '1').join(',');
    expect(codeOf(() => analyzeBuffer(new TextEncoder().encode(`${header}\n${row}\n${row}\n${row}\n`)))).toBe('TOO_MANY_COLUMNS');
  });
});
