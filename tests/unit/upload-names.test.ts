import { describe, expect, it } from 'vitest';
import { fitContentType, fitFileName, MAX_FILE_NAME } from '@server/lib/upload-names';

describe('fitFileName', () => {
  it('keeps a name within the limit as it is', () => {
    expect(fitFileName('pull 3 — stage 2.csv')).toBe('pull 3 — stage 2.csv');
  });
  it('cuts a long name to 300 characters, keeping its extension', () => {
    const name = `${'a'.repeat(500)}.csv`;
    const fitted = fitFileName(name);
    expect(Array.from(fitted)).toHaveLength(MAX_FILE_NAME);
    expect(fitted.endsWith('….csv')).toBe(true);
  });
  it('counts characters, not UTF-16 units, and never splits one', () => {
    const fitted = fitFileName(`${'🏍'.repeat(400)}.log`);
    expect(Array.from(fitted)).toHaveLength(MAX_FILE_NAME);
    expect(fitted).not.toMatch(/[\uD800-\uDBFF](?![\uDC00-\uDFFF])/);
  });
});

describe('fitContentType', () => {
  it('drops the parameters of a long type, then gives up to octet-stream', () => {
    expect(fitContentType('text/csv')).toBe('text/csv');
    expect(fitContentType(`text/csv; x=${'y'.repeat(200)}`)).toBe('text/csv');
    expect(fitContentType(`application/${'z'.repeat(200)}`)).toBe('application/octet-stream');
    expect(fitContentType('')).toBeNull();
  });
});
