import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { STAFF, WORKSHOP } from '@shared/roles';
import { Card, DataTable, ErrorState, Icon } from '@/components/ui';
import { formatDate, formatDateTime, formatHp, formatNumber, formatRpm, formatTorque } from '@shared/format';
import { useCurrentUser } from '@/lib/auth';
import { paths } from '@/config/paths';
import { runQueries } from '../api/runs/run-queries';
import { sessionQueries } from '../api/sessions/session-queries';
import { RunStatusBadge } from './run-status';
import { runColumn, runNameColumn } from './run-columns';

const col = runColumn;
const columns = [
  col.accessor('createdAt', { header: 'Date', cell: (c) => <span className="num">{formatDate(c.getValue())}</span> }),
  runNameColumn(),
  col.accessor('stageName', { header: 'Stage', cell: (c) => (c.getValue() ? `${c.getValue()}${c.row.original.isReference ? ' (reference)' : ''}` : <span className="text-ink-subtle">none</span>) }),
  col.accessor('status', { header: 'Status', cell: (c) => <RunStatusBadge status={c.getValue()} /> }),
  col.accessor('peakPowerHp', { header: 'Peak power', meta: { numeric: true }, cell: (c) => `${formatHp(c.getValue())}${c.row.original.peakPowerRpm ? ` @ ${formatRpm(c.row.original.peakPowerRpm)}` : ''}` }),
  col.accessor('peakTorqueLbft', { header: 'Peak torque', meta: { numeric: true }, cell: (c) => `${formatTorque(c.getValue())}${c.row.original.peakTorqueRpm ? ` @ ${formatRpm(c.row.original.peakTorqueRpm)}` : ''}` }),
];

/** The bike page's sessions and runs, newest first, with the way to upload more. */
export function BikeRunsSection({ bikeId }: { bikeId: string }) {
  const user = useCurrentUser();
  const runs = useQuery(runQueries.list({ bikeId, sort: '-createdAt', pageSize: 50 }));
  const sessions = useQuery({ ...sessionQueries.list(bikeId), enabled: STAFF.includes(user.role) });
  const canUpload = WORKSHOP.includes(user.role);
  return (
    <Card
      title="Dyno runs"
      description={runs.data ? `${runs.data.totalIsEstimate ? 'About ' : ''}${formatNumber(runs.data.total)} ${runs.data.total === 1 ? 'run' : 'runs'} in the archive` : undefined}
      actions={
        <div className="flex flex-wrap gap-2">
          {STAFF.includes(user.role) && (
            <Link to={`${paths.runs}?bikeId=${bikeId}`} className="inline-flex min-h-10 items-center rounded-control border border-line-strong px-3 text-sm font-semibold text-ink hover:bg-paper-sunk">
              All runs of this bike
            </Link>
          )}
          {canUpload && (
            <Link to={`${paths.upload}?bikeId=${bikeId}`} className="inline-flex min-h-10 items-center gap-1.5 rounded-control bg-accent px-3 text-sm font-semibold text-white hover:bg-accent-hover">
              <Icon name="upload" size={16} /> Upload runs
            </Link>
          )}
        </div>
      }
    >
      {sessions.data && sessions.data.length > 0 && (
        <div className="mb-4">
          <h3 className="mb-1 text-sm font-semibold text-ink-muted">Sessions</h3>
          <ul className="flex flex-wrap gap-2">
            {sessions.data.slice(0, 12).map((s) => (
              <li key={s.id}>
                <Link to={paths.session(s.id)} className="num inline-flex min-h-10 items-center rounded-control border border-line px-3 text-sm hover:bg-paper-sunk">
                  {formatDateTime(s.startedAt)} · {s.runCount} {s.runCount === 1 ? 'run' : 'runs'}
                  {!s.safetyConfirmedAt && <span className="ml-1 text-warn">(checks open)</span>}
                </Link>
              </li>
            ))}
          </ul>
        </div>
      )}
      {runs.isError ? (
        <ErrorState error={runs.error} onRetry={() => runs.refetch()} />
      ) : (
        <DataTable
          caption="Runs of this bike"
          columns={columns}
          data={runs.data?.items ?? []}
          getRowId={(r) => r.id}
          isLoading={runs.isLoading}
          maxHeight="28rem"
          emptyMessage={canUpload ? 'No runs yet. Upload the files of a dyno session.' : 'No runs yet.'}
        />
      )}
    </Card>
  );
}
