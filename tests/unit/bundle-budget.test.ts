import { describe, expect, it } from 'vitest';
import { checkBudget, FIRST_LOAD_GZIP_BYTES, LARGEST_CHUNK_GZIP_BYTES, type BudgetChunk } from '../../bench/lib/bundle-budget';

/**
 * The client size budget the build enforces (vite.config.ts bundleBudget). The limits, 146 kB
 * first load and 220 kB per chunk (gzip), are the product's targets; sizes here are injected, so
 * the test checks which chunks count, not zlib.
 */
const chunk = (fileName: string, imports: string[] = [], isEntry = false): BudgetChunk => ({ fileName, imports, isEntry, code: '' });

describe('bundle budget', () => {
  it('counts the entry and its static imports, once each, not lazy chunks', () => {
    const chunks = [chunk('index.js', ['ui.js', 'router.js'], true), chunk('ui.js', ['react.js']), chunk('router.js', ['react.js']), chunk('react.js'), chunk('charts.js')];
    const sizes: Record<string, number> = { 'index.js': 70_000, 'ui.js': 30_000, 'router.js': 20_000, 'react.js': 25_000, 'charts.js': 200_000 };
    const r = checkBudget(chunks, (c) => sizes[c.fileName]);
    expect(r.firstLoad.files.sort()).toEqual(['index.js', 'react.js', 'router.js', 'ui.js']);
    expect(r.firstLoad.gzipBytes).toBe(145_000);
    expect(r.largest).toEqual({ fileName: 'charts.js', gzipBytes: 200_000 });
    expect(r.problems).toEqual([]);
  });

  it('names what is over', () => {
    const chunks = [chunk('index.js', ['vendor.js'], true), chunk('vendor.js'), chunk('big.js')];
    const sizes: Record<string, number> = { 'index.js': FIRST_LOAD_GZIP_BYTES, 'vendor.js': 1, 'big.js': LARGEST_CHUNK_GZIP_BYTES + 1 };
    const r = checkBudget(chunks, (c) => sizes[c.fileName]);
    expect(r.problems).toHaveLength(2);
    expect(r.problems[0]).toMatch(/^first load is 146\.0 kB/);
    expect(r.problems[1]).toMatch(/^big\.js is 220\.0 kB gzip/);
  });
});
