/**
 * `npm run reprocess` — re-derive every run from its raw file (after a change to the analysis)
 * and print what changed per run. Connects like the server (DATABASE_URL, S3_* …; see
 * server/modules/runs/run-cli.ts for the local fallbacks used when they are unset).
 * Exits 0 when it ran (runs whose file could not be read are listed), 2 on bad settings.
 */
import { ConfigError } from '../config/env';
import { buildDeps } from '../main';
import { cliConfig, reprocessAll, type ReprocessLine } from '../modules/runs/run-cli';
import { Run } from '../modules/runs/run.entity';
import { startProgress } from './progress';

const fmt = (v: unknown) => (v === null || v === undefined ? '–' : String(v));

function text(line: ReprocessLine): string {
  const head = `${line.runId}  ${line.file}${line.pull ? ` (${line.pull})` : ''}`;
  if (line.error) return `${head}: NOT RE-PROCESSED — ${line.error}`;
  if (!line.changes.length) return `${head}: unchanged (${line.status})`;
  return `${head}: ${line.changes.map((c) => `${c.field} ${fmt(c.before)} → ${fmt(c.after)}`).join('; ')}`;
}

try {
  const deps = await buildDeps(cliConfig(), { poolMax: 2 });
  try {
    // The same rows reprocessAll pages through (the ORM's filters apply to both).
    const total = await deps.orm.em.fork().count(Run, {});
    const progress = startProgress({ total, noun: 'runs' });
    // On a terminal only changes and errors are worth a line above the bar; a log gets every run.
    const lines = await reprocessAll(deps, (line) => progress.tick(!process.stdout.isTTY || line.error || line.changes.length ? text(line) : undefined));
    const changed = lines.filter((l) => l.changes.length).length;
    const errors = lines.filter((l) => l.error).length;
    progress.finish(`\n${lines.length} run(s): ${changed} changed, ${lines.length - changed - errors} unchanged, ${errors} not re-processed.`);
  } finally {
    await deps.orm.close();
  }
  process.exit(0);
} catch (err) {
  console.error(err instanceof ConfigError ? err.message : err);
  process.exit(2);
}
