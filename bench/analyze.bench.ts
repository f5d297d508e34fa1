/**
 * Analysis bench: analyse a 100 000-row file and a 50 MB file; compare with csv-parse alone
 * parsing the same bytes into arrays (target ≤ 2×) and measure peak RSS of streaming analysis in
 * a child process (target ≤ 150 MB on the 50 MB file). Files are generated into the OS temp
 * folder, never committed.
 */
import { execFileSync } from 'node:child_process';
import { createWriteStream, existsSync, mkdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parse } from 'csv-parse/sync';
import { build } from 'esbuild';
import { analyzeBuffer } from '@shared/analysis/analyze';
import { largeRunFileChunks, syntheticRunFile } from '../server/db/synthetic-runs.js';
import { printTable } from './lib/table.js';

const DIR = join(tmpdir(), 'pullbook-bench');
const CHILD_SOURCE = fileURLToPath(new URL('./analyze-child.ts', import.meta.url));
const CHILD = join(DIR, 'analyze-child.mjs');

/**
 * Bundles the child to plain JavaScript (esbuild, which tsx itself runs on) so the child runs on
 * bare Node: the TypeScript loader's own worker thread would otherwise add ~70 MB to its RSS.
 */
async function bundleChild(): Promise<void> {
  await build({ entryPoints: [CHILD_SOURCE], outfile: CHILD, bundle: true, platform: 'node', format: 'esm', target: 'node20', logLevel: 'silent' });
}

async function ensureFiles(): Promise<{ name: string; path: string; repeats: number }[]> {
  mkdirSync(DIR, { recursive: true });
  const rows100k = join(DIR, 'run-100k-rows.csv');
  if (!existsSync(rows100k)) writeFileSync(rows100k, syntheticRunFile({ seed: 100, totalRows: 100_000 }).bytes);
  // 50 MB (decimal), under the default 50 MiB limit.
  const big = join(DIR, 'run-50mb.csv');
  if (!existsSync(big) || statSync(big).size < 45_000_000) {
    const out = createWriteStream(big);
    for (const chunk of largeRunFileChunks(50_000_000, { seed: 50 })) {
      if (!out.write(chunk)) await new Promise<void>((r) => out.once('drain', () => r()));
    }
    await new Promise<void>((r) => out.end(() => r()));
  }
  return [
    { name: '100 000 rows', path: rows100k, repeats: 3 },
    { name: '50 MB file', path: big, repeats: 1 },
  ];
}

function best(repeats: number, fn: () => void): number {
  let min = Infinity;
  for (let i = 0; i < repeats; i++) {
    const t0 = performance.now();
    fn();
    min = Math.min(min, performance.now() - t0);
  }
  return min;
}

/** Prints the analysis bench table. */
export async function run(): Promise<void> {
  const files = await ensureFiles();
  await bundleChild();
  const rows: string[][] = [
    ['case', 'size MB', 'rows', 'csv-parse ms', 'analyzeBuffer ms', 'ratio', 'analyzeFile ms', 'ratio', 'peak RSS MB', 'targets'],
  ];
  for (const f of files) {
    const bytes = readFileSync(f.path);
    let records = 0;
    const csvMs = best(f.repeats, () => {
      records = (parse(bytes, { delimiter: ',', relax_column_count: true }) as string[][]).length;
    });
    const bufferMs = best(f.repeats, () => void analyzeBuffer(bytes));
    const child = JSON.parse(
      execFileSync(process.execPath, [CHILD, f.path], { encoding: 'utf8', maxBuffer: 1 << 20 }),
    ) as { ms: number; peakRssMb: number };
    const ratioB = bufferMs / csvMs;
    const ratioF = child.ms / csvMs;
    // Both paths are held to the target: uploads use the streaming one.
    const targets = [ratioB <= 2 && ratioF <= 2 ? 'ratio ok' : `ratio OVER 2× (${ratioB > 2 ? 'buffer' : ''}${ratioB > 2 && ratioF > 2 ? ', ' : ''}${ratioF > 2 ? 'streaming' : ''})`, f.name.startsWith('50') ? (child.peakRssMb <= 150 ? 'RSS ok' : 'RSS OVER 150 MB') : ''].filter(Boolean).join(', ');
    rows.push([
      f.name,
      (bytes.length / 1e6).toFixed(1),
      String(records - 1),
      csvMs.toFixed(0),
      bufferMs.toFixed(0),
      `${ratioB.toFixed(2)}×`,
      child.ms.toFixed(0),
      `${ratioF.toFixed(2)}×`,
      child.peakRssMb.toFixed(0),
      targets,
    ]);
  }
  printTable(rows);
  process.stdout.write('ratio = analysis time ÷ csv-parse alone parsing the same bytes into arrays (target ≤ 2× for both analyzeBuffer and the streaming analyzeFile that uploads use); peak RSS of analyzeFile measured in a child process (target ≤ 150 MB on the 50 MB file).\n');
}
