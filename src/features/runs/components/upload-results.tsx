import { useState } from 'react';
import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import type { RunSummaryDto, UploadResult } from '@shared/schemas/run';
import type { ApiErrorCodeOnClient } from '@/lib/api-client';
import { Button, Icon, ProgressBar, StatusBadge } from '@/components/ui';
import { formatFileSize, formatHp, formatRpm, formatTorque } from '@shared/format';
import { paths } from '@/config/paths';
import { runQueries } from '../api/runs/run-queries';
import type { UploadItem } from '../api/runs/upload-runs';
import { CrossCheckBadge } from './run-status';
import { MappingDialog } from './mapping-dialog';
import { StageSelect } from './stages/stage-select';
import { PullResults } from './pull-results';

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

function Warnings({ warnings }: { warnings: RunSummaryDto['warnings'] }) {
  if (!warnings.length) return null;
  return (
    <ul className="mt-1 space-y-0.5 text-sm text-warn" aria-label="Warnings">
      {warnings.map((w) => (
        <li key={w.code + w.message} className="flex gap-1">
          <Icon name="triangle" size={16} className="mt-0.5 shrink-0" />
          <span>{w.message}</span>
        </li>
      ))}
    </ul>
  );
}

/** Reader codes after which choosing columns by hand can help. */
const MAPPING_CODES: ReadonlySet<string> = new Set(['NEEDS_MAPPING', 'MAPPING_INVALID', 'NO_RPM_COLUMN', 'TOO_MANY_COLUMNS'] satisfies ApiErrorCodeOnClient[]);

/** A file the server kept but could not turn into a curve: mapping by hand, or failed for good. */
function KeptFile({ item, runId, message, onMapped }: { item: UploadItem; runId: string; message: string; onMapped: (run: RunSummaryDto) => void }) {
  const run = useQuery(runQueries.detail(runId));
  const [open, setOpen] = useState(false);
  const needsMapping = run.data?.status === 'needs-mapping' || (item.result !== undefined && !item.result.ok && MAPPING_CODES.has(item.result.error.code));
  if (needsMapping) {
    return (
      <div className="space-y-2">
        <StatusBadge status="warning">Needs column mapping</StatusBadge>
        <p className="text-sm text-ink">{message} Nothing is lost: the file is kept until it is read.</p>
        <Button size="sm" variant="primary" onClick={() => setOpen(true)}>
          Choose columns…
        </Button>
        <MappingDialog runId={runId} fileName={item.file.name} open={open} onClose={() => setOpen(false)} onMapped={onMapped} error={run.data?.error ?? (item.result && !item.result.ok ? item.result.error : undefined)} />
      </div>
    );
  }
  return (
    <div className="space-y-1">
      <StatusBadge status="error">Not read</StatusBadge>
      <p className="text-sm text-ink">{message}</p>
      <p className="text-sm text-ink-muted">
        The file is kept in the archive and can be read again later.{' '}
        <Link className="font-semibold text-accent underline" to={paths.run(runId)}>
          Open it
        </Link>
      </p>
    </div>
  );
}

function ResultBody({ item, bikeId, onResult }: { item: UploadItem; bikeId: string; onResult: (r: UploadResult) => void }) {
  const r = item.result;
  if (item.state !== 'done' || !r) {
    const pct = item.total ? (item.loaded / item.total) * 100 : 0;
    const label = item.state === 'queued' ? `Waiting: ${item.file.name}` : item.state === 'analysing' ? `Reading ${item.file.name}` : `Uploading ${item.file.name}`;
    return (
      <ProgressBar
        label={
          <span className="[overflow-wrap:anywhere]" title={item.file.name}>
            {label}
          </span>
        }
        value={item.state === 'queued' ? 0 : pct}
        valueText={item.state === 'analysing' ? 'Sent, reading…' : item.state === 'queued' ? 'Waiting' : undefined}
      />
    );
  }
  if (r.runs && r.runs.length > 1) return <PullResults result={{ ...r, runs: r.runs }} />;
  if (r.ok && r.run.status !== 'ready') {
    return (
      <div className="space-y-1">
        {r.duplicate && <StatusBadge status="info">Already in the archive — the stored copy could not be read</StatusBadge>}
        <KeptFile item={item} runId={r.run.id} message={(r.duplicate ? r.message : undefined) ?? r.run.error?.message ?? ''} onMapped={(run) => onResult({ file: r.file, ok: true, run })} />
      </div>
    );
  }
  if (r.ok) {
    const run = r.run;
    return (
      <div className="space-y-2">
        <div className="flex flex-wrap items-center gap-2">
          {r.duplicate ? (
            <StatusBadge status="info">Already in the archive — not added again</StatusBadge>
          ) : (
            <StatusBadge status="ok">Read</StatusBadge>
          )}
          <CrossCheckBadge status={run.identityStatus} />
        </div>
        <PeakFigures run={run} />
        <Warnings warnings={run.warnings} />
        <div className="flex flex-wrap items-center gap-3">
          <StageSelect runId={run.id} bikeId={bikeId} stageId={run.stageId} runName={item.file.name} onChanged={(stageId) => onResult({ ...r, run: { ...run, stageId } })} />
          <Link className="font-semibold text-accent underline" to={paths.run(run.id)}>
            Open run
          </Link>
        </div>
      </div>
    );
  }
  if (r.runId) return <KeptFile item={item} runId={r.runId} message={r.error.message} onMapped={(run) => onResult({ file: r.file, ok: true, run })} />;
  return (
    <div className="space-y-1">
      <StatusBadge status="error">{r.error.code === ('ABORTED' satisfies ApiErrorCodeOnClient) ? 'Cancelled' : 'Upload failed'}</StatusBadge>
      <p className="text-sm text-ink">{r.error.message}</p>
    </div>
  );
}

/** One row per file: progress while it travels, then what Pullbook found in it. */
export function UploadResults({ items, bikeId, onResult }: { items: UploadItem[]; bikeId: string; onResult: (key: string, r: UploadResult) => void }) {
  if (!items.length) return null;
  const done = items.filter((i) => i.state === 'done').length;
  return (
    <section aria-labelledby="upload-results-h" className="space-y-2">
      <h3 id="upload-results-h" className="flex items-baseline justify-between font-semibold text-ink">
        <span>Files</span>
        <span className="num text-sm font-normal text-ink-muted" aria-live="polite">
          {done} of {items.length} done
        </span>
      </h3>
      <ul className="divide-y divide-line rounded-card border border-line bg-paper-raised" aria-label="Uploaded files">
        {items.map((item) => (
          <li key={item.key} className="grid gap-2 px-4 py-3 md:grid-cols-[minmax(10rem,16rem)_1fr]" data-testid="upload-item">
            <div className="min-w-0">
              {/* Long names wrap anywhere (no hidden part); the title repeats the full name. */}
              <div className="font-medium text-ink [overflow-wrap:anywhere]" title={item.file.name}>
                {item.file.name}
              </div>
              <div className="num text-sm text-ink-subtle">{formatFileSize(item.file.size)}</div>
            </div>
            <ResultBody item={item} bikeId={bikeId} onResult={(r) => onResult(item.key, r)} />
          </li>
        ))}
      </ul>
    </section>
  );
}
