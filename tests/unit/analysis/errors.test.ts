import { describe, expect, it } from 'vitest';
import { AnalysisError, analyzeBuffer, type AnalyzeOptions } from '@shared/analysis/index';
import { syntheticRunFile } from '@server/db/synthetic-runs';

const enc = (s: string) => new TextEncoder().encode(s);
const good = () => syntheticRunFile({ seed: 9 }, { columns: ['rpm', 'torque', 'power'] }).text;

function codeOf(bytes: Uint8Array, options?: AnalyzeOptions): { code: string; line?: number; column?: string; message: string } {
  try {
    analyzeBuffer(bytes, options);
  } catch (e) {
    expect(e).toBeInstanceOf(AnalysisError);
    const err = e as AnalysisError;
    expect(err.message.length).toBeGreaterThan(5);
    return { code: err.code, line: err.line, column: err.column, message: err.message };
  }
  throw new Error('expected an AnalysisError');
}

describe('bad input gets a typed error', () => {
  it('empty file', () => {
    expect(codeOf(new Uint8Array()).code).toBe('EMPTY_FILE');
    expect(codeOf(enc('\n\n  \r\n')).code).toBe('EMPTY_FILE');
  });
  it('binary file', () => {
    const png = Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 73, 72, 68, 82, 0, 0, 1, 0]);
    expect(codeOf(png).code).toBe('BINARY_FILE');
    const noisy = Uint8Array.from({ length: 4000 }, (_, i) => 1 + ((i * 7919) % 31));
    expect(codeOf(noisy).code).toBe('BINARY_FILE');
  });
  it('header only', () => {
    expect(codeOf(enc('Engine Speed [rpm],Torque [lb-ft],Power [hp]\n')).code).toBe('HEADER_ONLY');
  });
  it('too few points', () => {
    const lines = good().split('\n').slice(0, 6).join('\n');
    expect(codeOf(enc(lines)).code).toBe('TOO_FEW_POINTS');
  });
  it('no engine-speed column', () => {
    const text = 'Torque [lb-ft],Power [hp]\n' + Array.from({ length: 40 }, (_, i) => `${90 - i * 0.1},${40 + i}`).join('\n');
    const e = codeOf(enc(text));
    expect(e.code).toBe('NO_RPM_COLUMN');
  });
  it('neither power nor torque', () => {
    const text = 'Engine Speed [rpm],Time [s]\n' + Array.from({ length: 40 }, (_, i) => `${2000 + i * 100},${i * 0.1}`).join('\n');
    expect(codeOf(enc(text)).code).toBe('NO_POWER_OR_TORQUE');
  });
  it('non-numeric values, with line and column', () => {
    const lines = good().split('\n');
    lines[30] = lines[30].replace(/^(\d+),[^,]+/, '$1,abc');
    const e = codeOf(enc(lines.join('\n')));
    expect(e.code).toBe('NON_NUMERIC');
    expect(e.line).toBe(31);
    expect(e.column).toBe('Torque [lb-ft]');
  });
  it('rpm that never rises (no sweep)', () => {
    const text = 'RPM,Torque,Power\n' + Array.from({ length: 100 }, (_, i) => `${3000 + (i % 3)},50,${(50 * 3000) / 5252.113}`).join('\n');
    expect(codeOf(enc(text)).code).toBe('NO_SWEEP');
  });
  it('absurd values: negative rpm, rpm above 20 000, torque above 2 000 lb·ft', () => {
    const lines = good().split('\n');
    const at = (i: number, row: string) => {
      const copy = [...lines];
      copy[i] = row;
      return enc(copy.join('\n'));
    };
    const neg = codeOf(at(20, '-100,50,1'));
    expect(neg).toMatchObject({ code: 'ABSURD_VALUE', line: 21, column: 'Engine Speed [rpm]' });
    expect(codeOf(at(20, '25000,50,238')).code).toBe('ABSURD_VALUE');
    expect(codeOf(at(20, '3000,2500,1428')).code).toBe('ABSURD_VALUE');
  });
  it('file over the size limit', () => {
    expect(codeOf(enc(good()), { maxBytes: 1000 }).code).toBe('FILE_TOO_LARGE');
  });
  it('line over the limit', () => {
    const lines = good().split('\n');
    lines[40] = `3000,50,${'9'.repeat(200_000)}`;
    expect(codeOf(enc(lines.join('\n'))).code).toBe('LINE_TOO_LONG');
  });
  it('too many columns', () => {
    const header = Array.from({ length: 300 }, (_, i) => (i === 0 ? 'RPM' : i === 1 ? 'Torque' : `ch${i}`)).join(',');
    const rows = Array.from({ length: 30 }, (_, r) => Array.from({ length: 300 }, (_, i) => (i === 0 ? 2000 + r * 100 : 50)).join(','));
    expect(codeOf(enc([header, ...rows].join('\n'))).code).toBe('TOO_MANY_COLUMNS');
  });
  it('no table at all', () => {
    expect(codeOf(enc('just some words\nand more words\n')).code).toBe('NO_TABLE');
  });
  it('invalid options', () => {
    expect(codeOf(enc(good()), { gridRpm: -5 }).code).toBe('INVALID_OPTION');
    expect(codeOf(enc(good()), { correction: 'bogus' as never }).code).toBe('INVALID_OPTION');
  });
  it('correction without conditions', () => {
    expect(codeOf(enc(good()), { correction: 'sae-j1349' }).code).toBe('CONDITIONS_MISSING');
  });
});
