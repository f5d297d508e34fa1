/**
 * The client's size budget, checked on every `vite build` (vite.config.ts `bundleBudget()`):
 * - first load: the entry chunk and every chunk it imports statically (what index.html loads
 *   before anything renders) at most FIRST_LOAD_GZIP_BYTES, gzip;
 * - the largest JavaScript chunk at most LARGEST_CHUNK_GZIP_BYTES, gzip.
 * Sizes are gzip at zlib's default level, as Vite's own build report prints them.
 */
import { gzipSync } from 'node:zlib';

export const FIRST_LOAD_GZIP_BYTES = 146 * 1000;
export const LARGEST_CHUNK_GZIP_BYTES = 220 * 1000;

/** The parts of a Rollup/Rolldown output chunk the budget reads. */
export interface BudgetChunk {
  fileName: string;
  isEntry: boolean;
  imports: string[];
  code: string;
}

export interface BudgetReport {
  firstLoad: { files: string[]; gzipBytes: number };
  largest: { fileName: string; gzipBytes: number };
  problems: string[];
}

export const gzipBytes = (code: string) => gzipSync(Buffer.from(code, 'utf8')).length;

/** Measures the chunks against the budget; `size` is injectable for tests. */
export function checkBudget(chunks: BudgetChunk[], size: (c: BudgetChunk) => number = (c) => gzipBytes(c.code)): BudgetReport {
  const byName = new Map(chunks.map((c) => [c.fileName, c]));
  const sizes = new Map(chunks.map((c) => [c.fileName, size(c)]));
  const first = new Set<string>();
  const visit = (name: string) => {
    if (first.has(name) || !byName.has(name)) return;
    first.add(name);
    for (const next of byName.get(name)!.imports) visit(next);
  };
  for (const c of chunks) if (c.isEntry) visit(c.fileName);
  const firstBytes = [...first].reduce((sum, n) => sum + (sizes.get(n) ?? 0), 0);
  let largest = { fileName: '', gzipBytes: 0 };
  for (const c of chunks) if ((sizes.get(c.fileName) ?? 0) > largest.gzipBytes) largest = { fileName: c.fileName, gzipBytes: sizes.get(c.fileName)! };
  const kb = (n: number) => `${(n / 1000).toFixed(1)} kB`;
  const problems: string[] = [];
  if (firstBytes > FIRST_LOAD_GZIP_BYTES) problems.push(`first load is ${kb(firstBytes)} gzip (${[...first].join(', ')}); the budget is ${kb(FIRST_LOAD_GZIP_BYTES)}`);
  if (largest.gzipBytes > LARGEST_CHUNK_GZIP_BYTES) problems.push(`${largest.fileName} is ${kb(largest.gzipBytes)} gzip; no chunk may exceed ${kb(LARGEST_CHUNK_GZIP_BYTES)}`);
  return { firstLoad: { files: [...first], gzipBytes: firstBytes }, largest, problems };
}
