import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parse } from 'csv-parse/sync';
import { fastRecords } from '@shared/analysis/blocks';
import { csvOptions } from '@shared/analysis/table';
import type { Layout } from '@shared/analysis/layout';

/**
 * The fast path of the block parser must give exactly what the reference parser (csv-parse, with
 * the engine's options) gives, whenever it answers at all.
 */
const enc = (s: string) => new TextEncoder().encode(s);
const options = (delimiter: Layout['delimiter']) => csvOptions({ delimiter } as Layout);

describe('fastRecords matches csv-parse', () => {
  it('on typical run-file rows', () => {
    const block = enc('2000,95.1,36.2\n2010, 95.3 ,36.5\n\n2020,\t95.4,36.9,extra\nEnd of run\n,,\n');
    const fast = fastRecords(block, ',', 100_000);
    expect(fast).not.toBeNull();
    expect(fast).toEqual(parse(block, options(',')));
  });

  it('declines blocks it cannot answer exactly (quotes, CR, whitespace-only lines, long lines)', () => {
    expect(fastRecords(enc('"5,012",1\n'), ',', 100_000)).toBeNull();
    expect(fastRecords(enc('1,2\r\n3,4\r\n'), ',', 100_000)).toBeNull();
    expect(fastRecords(enc('1,2\n   \n3,4\n'), ',', 100_000)).toBeNull();
    expect(fastRecords(enc(`${'9'.repeat(50)}\n`), ',', 10)).toBeNull();
  });

  it('property: any quote-free LF text, every delimiter', () => {
    let answered = 0;
    const chars = fc.constantFrom(...'0123456789.,;|\t\n -eEabcRPM\f'.split(''));
    fc.assert(
      fc.property(fc.array(chars, { maxLength: 400 }), fc.constantFrom(',', ';', '\t', '|'), (a, d) => {
        const block = enc(a.join(''));
        const fast = fastRecords(block, d, 100_000);
        if (fast === null) return true;
        answered++;
        expect(fast).toEqual(parse(block, options(d as Layout['delimiter'])));
        return true;
      }),
      { numRuns: 500 },
    );
    // The comparison must actually have run on most inputs.
    expect(answered).toBeGreaterThan(150);
  });
});
