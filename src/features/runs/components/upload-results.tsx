import { useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import type { RunSummaryDto, UploadResult } from '@shared/schemas/run';
import type { ApiErrorCodeOnClient } from '@/lib/api-client';
import { Button, Icon, ProgressBar, useToast } from '@/components/ui';
import { formatFileSize, formatHp, formatRpm, formatTorque } from '@shared/format';
import { paths } from '@/config/paths';
import { runQueries } from '../api/runs/run-queries';
import { useReprocessRun } from '../api/runs/reprocess-run';
import type { UploadItem } from '../api/runs/upload-runs';
import { CrossCheckBadge } from './run-status';
import { MappingDialog } from './mapping-dialog';
import { StageSelect } from './stages/stage-select';
import { PullResults } from './pull-results';
import { PeakCells, RunGridHeader, RunGridRow, RunNameCell, SelectRunBox, StatusMark } from './run-grid';
import type { RunSelection } from './bulk-actions';

export function PeakFigures({ run }: { run: Pick<RunSummaryDto, 'peakPowerHp' | 'peakPowerRpm' | 'peakTorqueLbft' | 'peakTorqueRpm'> }) {
  return (
    <dl className="num flex flex-wrap gap-x-6 gap-y-1">
      <PeakFigure label="Peak power" value={formatHp(run.peakPowerHp)} rpm={run.peakPowerRpm} />
      <PeakFigure label="Peak torque" value={formatTorque(run.peakTorqueLbft)} rpm={run.peakTorqueRpm} />
    </dl>
  );
}

function PeakFigure({ label, value, rpm }: { label: string; value: string; rpm: number | null }) {
  return (
    <div>
      <dt className="text-sm text-ink-muted">{label}</dt>
      <dd className="text-lg font-semibold text-ink">
        {value} <span className="text-sm font-normal text-ink-muted">at {formatRpm(rpm)}</span>
      </dd>
    </div>
  );
}

/** A run's warnings as one short toggle ("1 warning"); the messages open under the line. */
export function WarningsToggle({ warnings, open, onToggle }: { warnings: RunSummaryDto['warnings']; open: boolean; onToggle: () => void }) {
  if (!warnings.length) return null;
  return (
    <button type="button" className="flex min-h-6 items-center gap-1 text-xs font-semibold text-warn underline-offset-2 hover:underline" aria-expanded={open} onClick={onToggle}>
      <Icon name="triangle" size={14} /> {warnings.length === 1 ? '1 warning' : `${warnings.length} warnings`}
    </button>
  );
}

export function WarningsList({ warnings }: { warnings: RunSummaryDto['warnings'] }) {
  return (
    <ul className="space-y-0.5 text-sm text-ink" aria-label="Warnings">
      {warnings.map((w) => (
        <li key={w.code + w.message} className="flex gap-1">
          <Icon name="triangle" size={16} className="mt-0.5 shrink-0 text-warn" />
          <span>{w.message}</span>
        </li>
      ))}
    </ul>
  );
}

/** Reader codes after which choosing columns by hand can help. */
const MAPPING_CODES: ReadonlySet<string> = new Set(['NEEDS_MAPPING', 'MAPPING_INVALID', 'NO_RPM_COLUMN', 'TOO_MANY_COLUMNS'] satisfies ApiErrorCodeOnClient[]);

/** A file the server kept but could not turn into a curve: mapping by hand, or "Read again". */
function KeptFileRow({ item, runId, message, duplicate, onMapped, select }: { item: UploadItem; runId: string; message: string; duplicate?: boolean; onMapped: (run: RunSummaryDto) => void; select?: ReactNode }) {
  const run = useQuery(runQueries.detail(runId));
  const reprocess = useReprocessRun();
  const toast = useToast();
  const [open, setOpen] = useState(false);
  const needsMapping = run.data?.status === 'needs-mapping' || (item.result !== undefined && !item.result.ok && MAPPING_CODES.has(item.result.error.code));
  const file = item.file.name;
  const readAgain = () =>
    reprocess.mutate(runId, {
      onSuccess: (r) => {
        onMapped(r);
        toast.success(`${file} was read again`, { description: r.status === 'ready' ? 'It is read now.' : (r.error?.message ?? 'It still cannot be read.') });
      },
      onError: (e) => toast.error(`${file} was not read again`, { description: e.message }),
    });
  return (
    <RunGridRow
      select={select}
      status={<StatusMark status={needsMapping ? 'needs-mapping' : 'failed'} />}
      name={<RunNameCell run={run.data} fileName={file} />}
      detail={
        <p className="text-sm text-ink">
          {duplicate && <span className="font-semibold">Already in the archive — the stored copy could not be read. </span>}
          {run.data?.error?.message ?? message} {needsMapping ? 'Nothing is lost: the file is kept until it is read.' : 'The file is kept in the archive.'}
        </p>
      }
      actions={
        <>
          {needsMapping ? (
            <Button size="sm" variant="primary" onClick={() => setOpen(true)}>
              Choose columns…
            </Button>
          ) : (
            <Button size="sm" icon={<Icon name="refresh" size={16} />} loading={reprocess.isPending} aria-label={`Read ${file} again`} onClick={readAgain}>
              Read again
            </Button>
          )}
          <Link className="text-sm font-semibold text-accent underline" to={paths.run(runId)}>
            Open it
          </Link>
          {needsMapping && <MappingDialog runId={runId} fileName={file} open={open} onClose={() => setOpen(false)} onMapped={onMapped} error={run.data?.error ?? (item.result && !item.result.ok ? item.result.error : undefined)} />}
        </>
      }
    />
  );
}

function ItemRow({ item, bikeId, onResult, selection }: { item: UploadItem; bikeId: string; onResult: (r: UploadResult) => void; selection?: RunSelection }) {
  const r = item.result;
  const file = item.file.name;
  if (item.state !== 'done' || !r) {
    const pct = item.total ? (item.loaded / item.total) * 100 : 0;
    const label = item.state === 'queued' ? `Waiting: ${file}` : item.state === 'analysing' ? `Reading ${file}` : `Uploading ${file}`;
    return (
      <RunGridRow
        status={<StatusMark status={item.state === 'queued' ? 'queued' : 'uploading'} word={item.state === 'analysing' ? 'Reading' : undefined} />}
        name={
          <ProgressBar
            className="lg:col-span-5"
            label={
              <span className="[overflow-wrap:anywhere]" title={file}>
                {label} <span className="text-ink-subtle">· {formatFileSize(item.file.size)}</span>
              </span>
            }
            value={item.state === 'queued' ? 0 : pct}
            valueText={item.state === 'analysing' ? 'Sent, reading…' : item.state === 'queued' ? 'Waiting' : undefined}
          />
        }
        peaks={<></>}
      />
    );
  }
  const select = (run: RunSummaryDto) =>
    selection && run.status === 'ready' ? <SelectRunBox label={`Select ${file}`} checked={selection.selected.has(run.id)} onChange={(on) => selection.toggle(run.id, on)} /> : undefined;
  if (r.runs && r.runs.length > 1) {
    return <RunGridRow status={<StatusMark status="ready" />} name={<RunNameCell fileName={file} />} detail={<PullResults result={{ ...r, runs: r.runs }} />} />;
  }
  const mapped = (run: RunSummaryDto) => onResult({ file: r.file, ok: true, run });
  if (r.ok && r.run.status !== 'ready') return <KeptFileRow item={item} runId={r.run.id} duplicate={r.duplicate} message={(r.duplicate ? r.message : undefined) ?? r.run.error?.message ?? ''} onMapped={mapped} />;
  if (r.ok) return <ReadRow result={r} file={file} bikeId={bikeId} onResult={onResult} select={select(r.run)} />;
  if (r.runId) return <KeptFileRow item={item} runId={r.runId} message={r.error.message} onMapped={mapped} />;
  const cancelled = r.error.code === ('ABORTED' satisfies ApiErrorCodeOnClient);
  return <RunGridRow status={<StatusMark status="failed-upload" word={cancelled ? 'Cancelled' : undefined} />} name={<RunNameCell fileName={file} />} detail={<p className="text-sm text-ink">{r.error.message}</p>} />;
}

/** A file read into one run: its figures, stage and cross-check on one line. */
function ReadRow({ result: r, file, bikeId, onResult, select }: { result: Extract<UploadResult, { ok: true }>; file: string; bikeId: string; onResult: (r: UploadResult) => void; select?: ReactNode }) {
  const [open, setOpen] = useState(false);
  const run = r.run;
  return (
    <RunGridRow
      select={select}
      status={
        <>
          <StatusMark status="ready" word={r.duplicate ? 'Already in the archive' : undefined} />
          <WarningsToggle warnings={run.warnings} open={open} onToggle={() => setOpen((o) => !o)} />
        </>
      }
      name={<RunNameCell run={run} fileName={file} />}
      peaks={<PeakCells run={run} />}
      stage={<StageSelect runId={run.id} bikeId={bikeId} stageId={run.stageId} runName={file} onChanged={(stageId, stageName) => onResult({ ...r, run: { ...run, stageId, stageName } })} />}
      actions={
        <>
          <CrossCheckBadge status={run.identityStatus} />
          <Link className="text-sm font-semibold text-accent underline" to={paths.run(run.id)} aria-label={`Open run ${file}`}>
            Open run
          </Link>
        </>
      }
      // In the page while folded (hidden), so find-in-page and the line's text still carry it.
      detail={
        run.warnings.length > 0 && (
          <div hidden={!open}>
            <WarningsList warnings={run.warnings} />
          </div>
        )
      }
    />
  );
}

/** The batch as a compact grid: progress while files travel, then what Pullbook found in each. */
export function UploadResults({ items, bikeId, onResult, selection }: { items: UploadItem[]; bikeId: string; onResult: (key: string, r: UploadResult) => void; selection?: RunSelection }) {
  if (!items.length) return null;
  const done = items.filter((i) => i.state === 'done').length;
  return (
    <section aria-labelledby="upload-results-h" className="space-y-2">
      {/* The counter sticks to the top of the screen while the list scrolls under it. */}
      <h3 id="upload-results-h" tabIndex={-1} className="sticky top-0 z-10 flex items-baseline justify-between rounded-control border border-line bg-paper-raised px-3 py-2 font-semibold text-ink shadow-card">
        <span>Files</span>
        <span className="num text-sm font-semibold text-ink" aria-live="polite" data-testid="upload-counter">
          {done} of {items.length} done
        </span>
      </h3>
      <div className="rounded-card border border-line bg-paper-raised">
        <RunGridHeader selectAll={selection?.selectAll} />
        <ul className="divide-y divide-line" aria-label="Uploaded files">
          {items.map((item) => (
            <ItemRow key={item.key} item={item} bikeId={bikeId} selection={selection} onResult={(r) => onResult(item.key, r)} />
          ))}
        </ul>
      </div>
    </section>
  );
}
