import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { RunStatusId, RunSummaryDto } from '@shared/schemas/run';
import { runFileLabel, runName } from '@shared/labels';
import { Icon, cn } from '@/components/ui';
import { formatHp, formatRpm, formatTorque } from '@shared/format';
import { paths } from '@/config/paths';

/**
 * The compact grid of runs that a batch of files became (upload screen, and the session page's
 * latest upload): one line per file with a status icon, the run's name and file, its peaks, its
 * stage and what can be done next, so forty files fit on a screen or two.
 */
export const GRID_COLUMNS = 'lg:grid-cols-[2.75rem_7.5rem_minmax(12rem,1.4fr)_7rem_7rem_minmax(10rem,1fr)_auto]';

export type GridStatus = RunStatusId | 'queued' | 'uploading' | 'failed-upload';

const STATUS_LOOK: Record<GridStatus, { icon: 'circle-check' | 'triangle' | 'octagon' | 'clock' | 'upload'; className: string; word: string }> = {
  ready: { icon: 'circle-check', className: 'text-gain', word: 'Read' },
  'needs-mapping': { icon: 'triangle', className: 'text-warn', word: 'Needs column mapping' },
  failed: { icon: 'octagon', className: 'text-loss', word: 'Not read' },
  queued: { icon: 'clock', className: 'text-ink-subtle', word: 'Waiting' },
  uploading: { icon: 'upload', className: 'text-accent', word: 'Uploading' },
  'failed-upload': { icon: 'octagon', className: 'text-loss', word: 'Upload failed' },
};

/** A status as an icon with its word (the icon carries the name for assistive technology). */
export function StatusMark({ status, word }: { status: GridStatus; word?: string }) {
  const look = STATUS_LOOK[status];
  const text = word ?? look.word;
  return (
    <span className={cn('flex items-center gap-1.5 text-sm font-semibold', look.className)}>
      <Icon name={look.icon} size={20} label={text} />
      <span aria-hidden="true" className="leading-tight">
        {text}
      </span>
    </span>
  );
}

/** The grid's column titles (from md up; below that each line stacks). */
export function RunGridHeader({ selectAll }: { selectAll?: ReactNode }) {
  return (
    <div className={cn('hidden items-end gap-3 border-b border-line px-3 py-2 text-xs font-semibold uppercase tracking-wide text-ink-muted lg:grid', GRID_COLUMNS)} aria-hidden="true">
      <span>{selectAll}</span>
      <span>Status</span>
      <span>Run · file</span>
      <span className="text-right">Peak power</span>
      <span className="text-right">Peak torque</span>
      <span>Stage</span>
      <span />
    </div>
  );
}

/** A run's name linking to its page, with its file as secondary text. */
export function RunNameCell({ run, fileName }: { run?: Pick<RunSummaryDto, 'id' | 'label' | 'sequence' | 'stageName' | 'originalName' | 'pullIndex' | 'pullCount'>; fileName: string }) {
  if (!run) {
    return (
      <span className="min-w-0 font-medium text-ink [overflow-wrap:anywhere]" title={fileName}>
        {fileName}
      </span>
    );
  }
  return (
    <span className="min-w-0">
      <Link to={paths.run(run.id)} className="block font-semibold text-accent underline-offset-2 hover:underline">
        {runName(run)}
      </Link>
      <span className="block text-sm text-ink-muted [overflow-wrap:anywhere]" title={run.originalName}>
        {runFileLabel(run)}
      </span>
    </span>
  );
}

/** Peak figures as grid cells; their labels are read out, the column titles show them. */
export function PeakCells({ run }: { run?: Pick<RunSummaryDto, 'peakPowerHp' | 'peakPowerRpm' | 'peakTorqueLbft' | 'peakTorqueRpm' | 'status'> }) {
  const ok = run?.status === 'ready';
  return (
    <>
      <span className="num text-sm lg:text-right">
        {ok && (
          <>
            <span className="sr-only">Peak power</span>
            {formatHp(run.peakPowerHp)}
            <span className="block text-xs text-ink-subtle">at {formatRpm(run.peakPowerRpm)}</span>
          </>
        )}
      </span>
      <span className="num text-sm lg:text-right">
        {ok && (
          <>
            <span className="sr-only">Peak torque</span>
            {formatTorque(run.peakTorqueLbft)}
            <span className="block text-xs text-ink-subtle">at {formatRpm(run.peakTorqueRpm)}</span>
          </>
        )}
      </span>
    </>
  );
}

/** One line of the grid; `children` spans the name-to-end columns when given (progress, messages). */
export function RunGridRow({ select, status, name, peaks, stage, actions, detail, testId = 'upload-item' }: { select?: ReactNode; status: ReactNode; name: ReactNode; peaks?: ReactNode; stage?: ReactNode; actions?: ReactNode; detail?: ReactNode; testId?: string }) {
  return (
    // Below lg (a tablet held upright): status over the name and its peaks, the stage and actions under them.
    <li className={cn('grid grid-cols-[2.75rem_minmax(0,1fr)_6.5rem_6.5rem] items-center gap-x-3 gap-y-0.5 px-3 py-1', GRID_COLUMNS)} data-testid={testId}>
      <span className="row-span-3 flex items-center self-start lg:row-span-1 lg:self-center">{select}</span>
      <span className="col-span-3 lg:col-span-1">{status}</span>
      {name}
      {peaks ?? (
        <>
          <span className="hidden lg:block" />
          <span className="hidden lg:block" />
        </>
      )}
      <span className="col-start-2 lg:col-start-auto">{stage}</span>
      <span className="col-span-2 flex flex-wrap items-center gap-2 lg:col-span-1 lg:justify-end">{actions}</span>
      {detail && <div className="col-span-3 col-start-2 lg:col-span-6 lg:col-start-2">{detail}</div>}
    </li>
  );
}

/** The select box of a run in a bulk selection (44 px target). */
export function SelectRunBox({ label, checked, onChange, disabled }: { label: string; checked: boolean; onChange: (checked: boolean) => void; disabled?: boolean }) {
  return (
    <label className="flex size-11 cursor-pointer items-center justify-center rounded-control hover:bg-paper-sunk">
      <input type="checkbox" className="size-5 accent-accent" aria-label={label} checked={checked} disabled={disabled} onChange={(e) => onChange(e.target.checked)} />
    </label>
  );
}
