import { describe, expect, it } from 'vitest';
import { execFile } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { analyzeBuffer } from '@shared/analysis/index';
import { successSummary } from '@server/cli/cli-support';
import { syntheticRunFile } from '@server/db/synthetic-runs';

const run = promisify(execFile);
const ROOT = join(import.meta.dirname, '..', '..', '..');
const TSX = join(ROOT, 'node_modules', '.bin', 'tsx');

// A noise-free run from the invented engine: 2 s steady lead-in and 1.5 s throttle-off tail at
// 20 samples/s around a 2000→5800 rpm sweep at 500 rpm/s, so by construction 40 lead-in rows and
// 29 tail rows lie outside the 153-row sweep (222 rows in all).
const OPTIONS = { seed: 11, rpmNoise: 0, torqueNoise: 0, leadInSeconds: 2, tailSeconds: 1.5, sampleHz: 20 };
const ROWS = 222;
const OUTSIDE_SWEEP = 40 + 29;

function writeRun(): string {
  const dir = mkdtempSync(join(tmpdir(), 'pullbook-cli-'));
  const path = join(dir, 'run.csv');
  writeFileSync(path, syntheticRunFile(OPTIONS).bytes);
  return path;
}

describe('analyze command line', () => {
  it('successSummary reports droppedPoints next to points and rpmRange', () => {
    const { bytes } = syntheticRunFile(OPTIONS);
    const s = successSummary('run.csv', analyzeBuffer(bytes));
    expect(s.droppedPoints).toBeTypeOf('number');
    expect((s.points as number) + (s.droppedPoints as number)).toBe(ROWS);
    // The sweep isolation may keep or drop a boundary row either side of the sweep.
    expect(Math.abs((s.droppedPoints as number) - OUTSIDE_SWEEP)).toBeLessThanOrEqual(2);
  });

  it('--json prints droppedPoints for each file', async () => {
    const path = writeRun();
    const { stdout } = await run(TSX, ['server/cli/analyze.ts', '--json', path], { cwd: ROOT });
    const [summary] = JSON.parse(stdout) as { ok: boolean; points: number; droppedPoints: number; rpmRange: [number, number] }[];
    expect(summary.ok).toBe(true);
    expect(summary.points + summary.droppedPoints).toBe(ROWS);
    expect(Math.abs(summary.droppedPoints - OUTSIDE_SWEEP)).toBeLessThanOrEqual(2);
    expect(summary.rpmRange[0]).toBeGreaterThanOrEqual(2000);
  });

  it('the readable table has a Dropped column', async () => {
    const path = writeRun();
    const { stdout } = await run(TSX, ['server/cli/analyze.ts', path], { cwd: ROOT });
    const [header, row] = stdout.split('\n');
    const at = header.indexOf('Dropped');
    expect(at).toBeGreaterThan(0);
    const dropped = Number(row.slice(at, at + 8).trim());
    expect(Math.abs(dropped - OUTSIDE_SWEEP)).toBeLessThanOrEqual(2);
  });
});
