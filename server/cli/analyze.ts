/**
 * `npm run --silent analyze -- [--json] [options] FILE...` — analyses run files.
 * JSON: an array with one object per file (shape fixed by issue 3); a file holding several pulls
 * gives one object per pull instead, in time order, each with a `pull` key. Exit 1 when any file failed.
 */
import { analyzeFilePulls } from '../lib/run-files/index.js';
import type { AnalysisResult } from '@shared/analysis/analyze';
import { AnalysisError } from '@shared/analysis/errors';
import { failureSummary, installCrashGuard, pullSummary, readCliArgs, round, successSummary } from './cli-support.js';

const USAGE = `Usage: analyze [--json] [--curve] [--grid 50] [--smooth N] [--correction none|sae-j1349|sae-j1349-1990|iso-1585|din-70020|sae-j607]
               [--temp C] [--baro kPa] [--humidity %] [--map JSON] [--rpm-per-mph N | --rpm-per-kmh N] FILE...`;

function tableLine(file: string, r: AnalysisResult, fileWidth: number): string {
  const check = r.identity.status === 'derived' ? 'derived' : `${r.identity.status} (max ${r.identity.maxDeviationPct.toFixed(1)} %)`;
  return [
    file.padEnd(fileWidth),
    `${r.peakPower.hp.toFixed(1)} hp @ ${r.peakPower.rpm}`.padEnd(20),
    `${r.peakTorque.lbft.toFixed(1)} lb·ft @ ${r.peakTorque.rpm}`.padEnd(24),
    `${r.rpmRange[0]}–${r.rpmRange[1]}`.padEnd(12),
    String(r.droppedPoints).padEnd(8),
    check.padEnd(20),
    `${r.correction.standard} ×${round(r.correction.factor, 4)}`,
  ].join(' ');
}

async function main(): Promise<number> {
  installCrashGuard();
  const args = readCliArgs(process.argv.slice(2), USAGE, (n) => n > 0);
  if (typeof args === 'number') return args;
  const summaries: Record<string, unknown>[] = [];
  let failed = false;
  const fileWidth = Math.max(32, ...args.files.map((f) => f.length + 14));
  if (!args.json) {
    process.stdout.write(`${'File'.padEnd(fileWidth)} ${'Peak power'.padEnd(20)} ${'Peak torque'.padEnd(24)} ${'rpm range'.padEnd(12)} ${'Dropped'.padEnd(8)} ${'Cross-check'.padEnd(20)} Correction\n`);
  }
  for (const file of args.files) {
    try {
      const { pulls } = await analyzeFilePulls(file, args.options);
      for (const r of pulls) {
        summaries.push(pulls.length === 1 ? successSummary(file, r, args.curve) : pullSummary(file, r, args.curve));
        if (!args.json) {
          const label = pulls.length === 1 ? file : `${file} #${r.pull.index + 1}${r.pull.partial ? ' (partial)' : ''}`;
          process.stdout.write(`${tableLine(label, r, fileWidth)}\n`);
          for (const w of r.warnings) process.stdout.write(`    ! ${w.code}: ${w.message}\n`);
        }
      }
    } catch (e) {
      failed = true;
      summaries.push(failureSummary(file, e));
      if (!args.json) {
        const err = e instanceof AnalysisError ? e : new AnalysisError('READ_FAILED', 'The file could not be read.');
        const where = err.line !== undefined ? ` (line ${err.line})` : '';
        process.stdout.write(`${file.padEnd(fileWidth)} FAILED ${err.code}: ${err.message}${where}\n`);
      }
    }
  }
  if (args.json) process.stdout.write(`${JSON.stringify(summaries, null, 2)}\n`);
  return failed ? 1 : 0;
}

process.exitCode = await main();
