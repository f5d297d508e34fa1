/**
 * `npm run import -- --bike ID --stage NAME DIR` — bring a folder of old run files into the
 * archive for one bike, tagged with a stage (created when missing), through the same pipeline as
 * an upload (raw file to storage, analysis, database). Connects like the server (DATABASE_URL,
 * S3_* …; see server/modules/runs/run-cli.ts for the local fallbacks used when they are unset).
 * Exit 0 when every file is in the archive (ready, waiting for a mapping or failed but kept),
 * 1 when some file could not be stored, 2 on bad arguments or settings.
 */
import fs from 'node:fs';
import { parseArgs } from 'node:util';
import { ConfigError } from '../config/env';
import { buildDeps } from '../main';
import { cliConfig, importFolder } from '../modules/runs/run-cli';
import type { RunSummaryDto, UploadResult } from '@shared/schemas/run';
import { startProgress } from './progress';

const usage = 'usage: npm run import -- --bike BIKE_ID --stage "STAGE NAME" FOLDER';

const peaksOf = (run: RunSummaryDto) =>
  run.peakPowerHp !== null ? `${run.peakPowerHp.toFixed(1)} hp @ ${run.peakPowerRpm} rpm, ${run.peakTorqueLbft?.toFixed(1)} lb·ft @ ${run.peakTorqueRpm} rpm` : '';

/** One line per file; a log holding several pulls adds one indented line per run. */
function line(r: UploadResult) {
  const pulls = r.runs && r.runs.length > 1
    ? `\n${r.runs.map((run) => `  pull ${run.pullIndex + 1} of ${run.pullCount} (${run.id}) ${run.status}${run.warnings.some((w) => w.code === 'PULL_PARTIAL') ? ', partial' : ''}${run.review ? ', REVIEW' : ''} ${peaksOf(run)}`).join('\n')}`
    : '';
  const found = r.pullCount && r.pullCount > 1 ? `, ${r.pullCount} pulls found` : '';
  if (r.ok) return `${r.file}: ${r.duplicate ? 'already in the archive' : 'imported'} (${r.run.id}${found}) ${r.runs && r.runs.length > 1 ? '' : peaksOf(r.run)}${pulls}`;
  return `${r.file}: ${r.runId ? `kept as ${r.runId}, ` : 'NOT STORED, '}${r.error.code}: ${r.error.message}${pulls}`;
}

let args;
try {
  args = parseArgs({ options: { bike: { type: 'string' }, stage: { type: 'string' } }, allowPositionals: true });
} catch (e) {
  console.error(`${e instanceof Error ? e.message : e}\n${usage}`);
  process.exit(2);
}
const { bike, stage } = args.values;
const dir = args.positionals[0];
if (!bike || !stage || !dir || args.positionals.length !== 1) {
  console.error(usage);
  process.exit(2);
}
if (!fs.existsSync(dir) || !fs.statSync(dir).isDirectory()) {
  console.error(`Not a folder: ${dir}\n${usage}`);
  process.exit(2);
}

try {
  const deps = await buildDeps(cliConfig(), { poolMax: 2 });
  try {
    // The files importFolder reads: every plain file of the folder that is not hidden.
    const total = fs.readdirSync(dir, { withFileTypes: true }).filter((d) => d.isFile() && !d.name.startsWith('.')).length;
    const progress = startProgress({ total, noun: 'files' });
    const out = await importFolder(deps, { bikeId: bike, stageName: stage, dir }, (r) => progress.tick(line(r)));
    const stored = out.results.filter((r) => r.ok || r.runId).length;
    const imported = out.results.filter((r) => r.ok && !r.duplicate).length;
    const duplicates = out.results.filter((r) => r.ok && r.duplicate).length;
    progress.finish(
      `\nStage "${stage}" ${out.created ? 'created' : 'existing'} (${out.stageId}); ${stored} of ${out.results.length} file(s) in the archive: ${imported} imported, ${duplicates} already there, ${stored - imported - duplicates} kept but not read, ${out.results.length - stored} not stored.`,
    );
    process.exitCode = stored === out.results.length ? 0 : 1;
  } finally {
    await deps.orm.close();
  }
} catch (err) {
  console.error(err instanceof ConfigError ? err.message : err instanceof Error ? err.message : err);
  process.exitCode = 2;
}
