/**
 * `npm run --silent compare -- [--json] [options] BEFORE AFTER` — compares two runs.
 * Both runs are analysed with the same options (grid, smoothing, correction), corrected, and
 * compared over their common rpm range. JSON: before/after summaries plus ComparisonFigures
 * (without the point-wise delta).
 */
import { analyzeFile } from '../lib/run-files/index.js';
import type { AnalysisResult } from '@shared/analysis/analyze';
import { compareCurves } from '@shared/analysis/compare';
import { applyCorrection } from '@shared/analysis/curve';
import { AnalysisError } from '@shared/analysis/errors';
import { failureSummary, installCrashGuard, readCliArgs, round, successSummary } from './cli-support.js';

const USAGE = `Usage: compare [--json] [--bands 1000] [--grid 50] [--smooth N] [--correction STD] [--temp C] [--baro kPa] [--humidity %]
               [--rpm-per-mph N | --rpm-per-kmh N] BEFORE AFTER
(A log holding several pulls is compared by its main pull, the one with the largest rpm rise.)`;

async function main(): Promise<number> {
  installCrashGuard();
  const args = readCliArgs(process.argv.slice(2), USAGE, (n) => n === 2);
  if (typeof args === 'number') return args;
  const [beforeFile, afterFile] = args.files;
  const results: (AnalysisResult | null)[] = [];
  const summaries: Record<string, unknown>[] = [];
  for (const file of [beforeFile, afterFile]) {
    try {
      const r = await analyzeFile(file, args.options);
      results.push(r);
      summaries.push(successSummary(file, r));
    } catch (e) {
      results.push(null);
      summaries.push(failureSummary(file, e));
    }
  }
  const [before, after] = results;
  const fail = (error: { code: string; message: string }) => {
    if (args.json) process.stdout.write(`${JSON.stringify({ before: summaries[0], after: summaries[1], ok: false, error }, null, 2)}\n`);
    else process.stdout.write(`Comparison failed: ${error.code}: ${error.message}\n`);
    return 1;
  };
  if (!before || !after) {
    const bad = (summaries[before ? 1 : 0] as { error: { code: string; message: string } }).error;
    return fail({ code: bad.code, message: `${before ? afterFile : beforeFile}: ${bad.message}` });
  }
  let figures;
  try {
    figures = compareCurves(
      applyCorrection(before.curve, before.correction.factor),
      applyCorrection(after.curve, after.correction.factor),
      { bandWidthRpm: args.bandWidthRpm },
    );
  } catch (e) {
    const err = e instanceof AnalysisError ? e : new AnalysisError('NO_COMMON_RANGE', 'The runs could not be compared.');
    return fail({ code: err.code, message: err.message });
  }
  const { delta: _delta, ...rest } = figures;
  void _delta;
  const json = {
    before: summaries[0],
    after: summaries[1],
    commonRpm: rest.commonRpm,
    peakPowerGain: { hp: round(rest.peakPowerGain.hp, 2), pct: round(rest.peakPowerGain.pct, 2) },
    peakTorqueGain: { lbft: round(rest.peakTorqueGain.lbft, 2), pct: round(rest.peakTorqueGain.pct, 2) },
    areaGainPct: round(rest.areaGainPct, 2),
    averagePowerGainHp: round(rest.averagePowerGainHp, 2),
    bands: rest.bands.map((b) => ({
      from: b.from,
      to: b.to,
      averagePowerGainHp: round(b.averagePowerGainHp, 2),
      averageTorqueGainLbft: round(b.averageTorqueGainLbft, 2),
    })),
    largestGain: { rpm: rest.largestGain.rpm, hp: round(rest.largestGain.hp, 2) },
    largestLoss: { rpm: rest.largestLoss.rpm, hp: round(rest.largestLoss.hp, 2) },
    peakPowerRpmShift: rest.peakPowerRpmShift,
    peakTorqueRpmShift: rest.peakTorqueRpmShift,
    averageTorqueGainLbft: round(rest.averageTorqueGainLbft, 2),
  };
  if (args.json) {
    process.stdout.write(`${JSON.stringify(json, null, 2)}\n`);
    return 0;
  }
  const sign = (v: number, d = 1) => `${v >= 0 ? '+' : ''}${v.toFixed(d)}`;
  const lines = [
    `Before: ${beforeFile}  ${before.peakPower.hp.toFixed(1)} hp @ ${before.peakPower.rpm}, ${before.peakTorque.lbft.toFixed(1)} lb·ft @ ${before.peakTorque.rpm}`,
    `After:  ${afterFile}  ${after.peakPower.hp.toFixed(1)} hp @ ${after.peakPower.rpm}, ${after.peakTorque.lbft.toFixed(1)} lb·ft @ ${after.peakTorque.rpm}`,
    `Correction: ${before.correction.standard}`,
    `Common range: ${rest.commonRpm[0]}–${rest.commonRpm[1]} rpm`,
    `Peak power:  ${sign(rest.peakPowerGain.hp)} hp (${sign(rest.peakPowerGain.pct)} %), peak moved ${sign(rest.peakPowerRpmShift, 0)} rpm`,
    `Peak torque: ${sign(rest.peakTorqueGain.lbft)} lb·ft (${sign(rest.peakTorqueGain.pct)} %), peak moved ${sign(rest.peakTorqueRpmShift, 0)} rpm`,
    `Area under the power curve: ${sign(rest.areaGainPct)} %; average ${sign(rest.averagePowerGainHp)} hp across the range`,
    `Largest gain ${sign(rest.largestGain.hp)} hp at ${rest.largestGain.rpm} rpm; ${
      rest.largestLoss.hp < 0 ? 'largest loss' : 'no loss anywhere, smallest change'
    } ${sign(rest.largestLoss.hp)} hp at ${rest.largestLoss.rpm} rpm`,
    'By band:',
    ...rest.bands.map((b) => `  ${String(b.from).padStart(6)}–${String(b.to).padEnd(6)} ${sign(b.averagePowerGainHp).padStart(7)} hp ${sign(b.averageTorqueGainLbft).padStart(7)} lb·ft`),
  ];
  process.stdout.write(`${lines.join('\n')}\n`);
  return 0;
}

process.exitCode = await main();
