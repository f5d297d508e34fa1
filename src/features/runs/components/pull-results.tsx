import { Link } from 'react-router-dom';
import type { RunSummaryDto, UploadResult } from '@shared/schemas/run';
import { Icon, StatusBadge } from '@/components/ui';
import { formatHp, formatRpm, formatTorque } from '@shared/format';
import { paths } from '@/config/paths';
import { CrossCheckBadge, RunFlags, RunStatusBadge } from './run-status';

/** "3 pulls found in file.csv": the headline of a log that held several pulls. */
export const pullsFoundText = (count: number, file: string) => `${count} pulls found in ${file}`;

/** A log that held several pulls: one row per run, each with its own peaks, flags and warnings. */
export function PullResults({ result }: { result: UploadResult & { runs: RunSummaryDto[] } }) {
  const count = result.pullCount ?? result.runs.length;
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap items-center gap-2">
        {result.ok && result.duplicate ? <StatusBadge status="info">Already in the archive — not added again</StatusBadge> : <StatusBadge status="ok">Read</StatusBadge>}
        <span className="font-semibold text-ink" data-testid="pulls-found">
          {pullsFoundText(count, result.file)}
        </span>
      </div>
      {result.ok && result.message && <p className="text-sm text-ink-muted">{result.message}</p>}
      <ol className="space-y-2" aria-label={`Runs from ${result.file}`}>
        {result.runs.map((run) => (
          <li key={run.id} className="rounded-control border border-line px-3 py-2" data-testid="pull-run">
            <div className="flex flex-wrap items-center gap-2">
              <Link className="font-semibold text-accent underline" to={paths.run(run.id)}>
                Run {run.sequence}
              </Link>
              <RunStatusBadge status={run.status} deleted={Boolean(run.deletedAt)} />
              {run.status === 'ready' && <CrossCheckBadge status={run.identityStatus} />}
              <RunFlags run={run} />
            </div>
            {run.status === 'ready' && (
              <p className="num mt-1 text-sm text-ink">
                {formatHp(run.peakPowerHp)} at {formatRpm(run.peakPowerRpm)} · {formatTorque(run.peakTorqueLbft)} at {formatRpm(run.peakTorqueRpm)} · {formatRpm(run.rpmMin)}–{formatRpm(run.rpmMax)}
              </p>
            )}
            {run.warnings
              .filter((w) => w.code !== 'PULLS_FOUND')
              .map((w) => (
                <p key={w.code + w.message} className="mt-1 flex gap-1 text-sm text-warn" data-code={w.code}>
                  <Icon name="triangle" size={16} className="mt-0.5 shrink-0" />
                  <span>{w.message}</span>
                </p>
              ))}
          </li>
        ))}
      </ol>
    </div>
  );
}

/** For a list of runs: each file that held several pulls, with the numbers of its runs ("3 pulls found in x.csv: runs 4, 5, 6"). */
export function PullFilesNote({ runs }: { runs: RunSummaryDto[] }) {
  const files = new Map<string, { count: number; sequences: number[] }>();
  for (const r of runs) {
    if (r.pullCount < 2) continue;
    // Runs of one log share its file name and its pull count; key on both.
    const key = `${r.originalName}\u0000${r.pullCount}`;
    const f = files.get(key) ?? { count: r.pullCount, sequences: [] };
    f.sequences.push(r.sequence);
    files.set(key, f);
  }
  if (!files.size) return null;
  return (
    <ul className="space-y-0.5 px-4 py-2 text-sm text-ink" aria-label="Logs holding several pulls">
      {[...files].map(([key, f]) => (
        <li key={key} data-testid="pulls-found">
          <Icon name="circle-info" size={16} className="mr-1 inline text-info" />
          {pullsFoundText(f.count, key.split('\u0000')[0])}: runs {f.sequences.sort((a, b) => a - b).join(', ')}
        </li>
      ))}
    </ul>
  );
}
