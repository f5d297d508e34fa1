import { describe, expect, it } from 'vitest';
import { execFile } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { analyzeBuffer } from '@shared/analysis/index';
import { successSummary } from '@server/cli/cli-support';
import { renderRunFile, syntheticLog, syntheticRunFile } from '@server/db/synthetic-runs';

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

describe('analyze command line: several pulls, engine speed from road speed', () => {
  it('--json prints one object per pull, in time order, for a log holding several', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pullbook-cli-'));
    const path = join(dir, 'three-pulls.csv');
    const log = syntheticLog({ seed: 4, pulls: [{ startRpm: 2000, endRpm: 5800 }, { startRpm: 2000, endRpm: 5800 }, { startRpm: 2000, endRpm: 3200 }], idleSeconds: 1 });
    writeFileSync(path, renderRunFile(log).bytes);
    const { stdout } = await run(TSX, ['server/cli/analyze.ts', '--json', path], { cwd: ROOT });
    const out = JSON.parse(stdout) as { file: string; ok: boolean; pull: { index: number; count: number; partial: boolean; lineRange: [number, number] }; warnings: { code: string }[] }[];
    expect(out).toHaveLength(3);
    expect(out.map((o) => o.pull.index)).toEqual([0, 1, 2]);
    expect(out.every((o) => o.ok && o.file === path && o.pull.count === 3)).toBe(true);
    expect(out[0].pull.lineRange[1]).toBeLessThan(out[1].pull.lineRange[0]);
    expect(out.map((o) => o.pull.partial)).toEqual([false, false, true]);
    expect(out[2].warnings.map((w) => w.code)).toContain('PULL_PARTIAL');
  });

  it('--rpm-per-mph reads a log with road speed only', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pullbook-cli-'));
    const path = join(dir, 'speed-only.csv');
    const file = syntheticRunFile({ ...OPTIONS, seed: 12 }, { columns: ['time', 'speed', 'torque', 'power'] });
    writeFileSync(path, file.bytes);
    const failed = await run(TSX, ['server/cli/analyze.ts', '--json', path], { cwd: ROOT }).catch((e: { stdout: string }) => e);
    expect((JSON.parse(failed.stdout) as { error: { code: string } }[])[0].error.code).toBe('NO_RPM_COLUMN');
    // The generator logs road speed as rpm / 46 (46 rpm per mph, invented gearing).
    const { stdout } = await run(TSX, ['server/cli/analyze.ts', '--json', '--rpm-per-mph', '46', path], { cwd: ROOT });
    const [summary] = JSON.parse(stdout) as { ok: boolean; peakPower: { hp: number } }[];
    expect(summary.ok).toBe(true);
    expect(Math.abs(summary.peakPower.hp / file.run.truth.peakPower.hp - 1)).toBeLessThan(0.01);
  });
});
