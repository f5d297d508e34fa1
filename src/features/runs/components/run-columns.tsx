import { Link } from 'react-router-dom';
import { createColumnHelper } from '@tanstack/react-table';
import type { RunSummaryDto } from '@shared/schemas/run';
import { formatHp, formatRpm, formatTorque } from '@shared/format';
import { paths } from '@/config/paths';
import { runFileLabel, runName as sharedRunName } from '@shared/labels';
import { RunFlags } from './run-status';

/** Column pieces shared by the run tables (run list, session, bike page), so a run reads the same everywhere. */
export const runColumn = createColumnHelper<RunSummaryDto>();

/** The run's one name everywhere (src/shared/labels.ts): its label, else "<stage> · pull <n>". */
export const runName = (r: RunSummaryDto) => sharedRunName(r);

/** On a tablet a table keeps its 'key' columns in view and folds its 'extra' ones (DataTable). */
type Priority = 'key' | 'extra' | undefined;

/** Run name linking to the run page, with its file as secondary text. */
export const runNameColumn = (priority?: Priority) =>
  runColumn.accessor(runName, {
    id: 'name',
    header: 'Run',
    meta: { priority },
    cell: (c) => (
      <>
        <Link to={paths.run(c.row.original.id)} className="font-semibold text-accent underline-offset-2 hover:underline">
          {c.getValue()}
        </Link>
        <span className="block text-sm text-ink-muted [overflow-wrap:anywhere]">{runFileLabel(c.row.original)}</span>
        <span className="mt-0.5 flex flex-wrap gap-1 empty:hidden">
          <RunFlags run={c.row.original} />
        </span>
      </>
    ),
  });

/** A peak figure with the rpm it was reached at on a second line. */
function PeakCell({ value, rpm }: { value: string; rpm: number | null }) {
  return (
    <span>
      {value}
      <span className="block text-xs text-ink-subtle">{rpm ? `at ${formatRpm(rpm)}` : ''}</span>
    </span>
  );
}

export const peakPowerColumn = (priority?: Priority) =>
  runColumn.accessor('peakPowerHp', {
    id: 'peakPowerHp',
    header: 'Peak power',
    meta: { numeric: true, priority },
    cell: (c) => <PeakCell value={formatHp(c.getValue())} rpm={c.row.original.peakPowerRpm} />,
  });

export const peakTorqueColumn = (priority?: Priority) =>
  runColumn.accessor('peakTorqueLbft', {
    id: 'peakTorqueLbft',
    header: 'Peak torque',
    meta: { numeric: true, priority },
    cell: (c) => <PeakCell value={formatTorque(c.getValue())} rpm={c.row.original.peakTorqueRpm} />,
  });
