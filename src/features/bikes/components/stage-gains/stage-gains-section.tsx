import { useMemo } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { createColumnHelper } from '@tanstack/react-table';
import { STAFF } from '@shared/roles';
import { formatDate, formatMoney, formatNumber } from '@shared/format';
import { Card, DataTable, ErrorState, LoadingState } from '@/components/ui';
import { hasRole, useCurrentUser } from '@/lib/auth';
import { paths } from '@/config/paths';
import { bikeQueries } from '../../api/bike-queries';
import { StageGainsChart } from './stage-gains-chart';
import { stageGainBars, stageGainRows, type GainRow } from './stage-gains-figures';

const none = <span className="text-ink-subtle">—</span>;
const money = (cents: number | null) => (cents === null ? none : formatMoney(cents, { minorUnits: true, wholeUnits: true }));
const hp = (v: number | null, signed = false) => (v === null ? none : formatNumber(v, { decimals: 1, signed }));

const col = createColumnHelper<GainRow>();
const columns = [
  col.accessor('name', {
    header: 'Stage',
    meta: { priority: 'key' },
    cell: (c) => <span className="font-semibold">{c.getValue()}</span>,
  }),
  col.accessor('date', { header: 'Date', meta: { numeric: true, priority: 'extra' }, cell: (c) => (c.getValue() ? formatDate(c.getValue()!) : none) }),
  col.accessor('peakPowerHp', { header: 'Peak power (hp)', meta: { numeric: true }, cell: (c) => hp(c.getValue()) }),
  col.accessor('peakTorqueLbft', { header: 'Peak torque (lb·ft)', meta: { numeric: true, priority: 'extra' }, cell: (c) => hp(c.getValue()) }),
  col.accessor('gainHp', { header: 'Gain (hp)', meta: { numeric: true, priority: 'key' }, cell: (c) => hp(c.getValue(), true) }),
  col.accessor('gainCostCents', { header: 'Its cost', meta: { numeric: true, priority: 'extra' }, cell: (c) => money(c.getValue()) }),
  col.accessor('costPerHpCents', { header: 'Cost per hp', meta: { numeric: true, priority: 'key' }, cell: (c) => money(c.getValue()) }),
  col.accessor('totalGainHp', { header: 'Total gain (hp)', meta: { numeric: true, priority: 'key' }, cell: (c) => hp(c.getValue(), true) }),
  col.accessor('totalCostCents', { header: 'Total cost', meta: { numeric: true, priority: 'extra' }, cell: (c) => money(c.getValue()) }),
  col.accessor('totalCostPerHpCents', { header: 'Total cost per hp', meta: { numeric: true }, cell: (c) => money(c.getValue()) }),
  col.accessor('spreadHp', {
    header: 'Spread (± hp)',
    meta: { numeric: true, priority: 'extra' },
    cell: (c) => (c.getValue() === null ? <span className="text-ink-subtle">one run</span> : formatNumber(c.getValue(), { decimals: 1 })),
  }),
];

/**
 * Gains by stage: a chart of what each stage added and what that cost per hp, and under it the
 * figures one per cell. "Gain" is over the previous measured stage and "Its cost" is every stage's
 * work since that one (a stage without a reference run counts towards the next measured stage);
 * "Total" is since the baseline. Peak power from each stage's reference run.
 */
export function BikeStageGains({ bikeId }: { bikeId: string }) {
  const user = useCurrentUser();
  const isStaff = hasRole(user, STAFF);
  const q = useQuery(bikeQueries.stageGains(bikeId));
  const rows = useMemo(() => (q.data ? stageGainRows(q.data.stages) : []), [q.data]);
  const bars = useMemo(() => (q.data ? stageGainBars(q.data.stages) : []), [q.data]);
  const unmeasured = rows.some((r) => !r.measured);
  return (
    <Card
      title="Gains by stage"
      description="Peak power gain of each stage over the stage before it, and what that work cost per hp. Totals are since the baseline. Figures from each stage’s reference run."
      actions={
        isStaff && (
          <Link to={`${paths.newComparison}?bikeId=${bikeId}`} className="focus-ring inline-flex min-h-11 items-center rounded-control font-semibold text-accent underline-offset-2 hover:underline">
            Compare runs
          </Link>
        )
      }
      flush
    >
      {q.isPending ? (
        <LoadingState compact message="Loading the gains by stage…" />
      ) : q.isError ? (
        <ErrorState error={q.error} onRetry={() => q.refetch()} isRetrying={q.isFetching} />
      ) : q.data.stages.length === 0 ? (
        <p className="px-4 py-3 text-ink-muted md:px-5">No stages recorded for this bike yet.</p>
      ) : (
        <>
          {q.data.warnings.filter((w) => w.code !== 'SEVERAL_BIKES').length > 0 && (
            <ul className="border-b border-line bg-warn-soft px-4 py-2 text-sm md:px-5">
              {q.data.warnings
                .filter((w) => w.code !== 'SEVERAL_BIKES')
                .map((w, i) => (
                  <li key={i}>{w.message}</li>
                ))}
            </ul>
          )}
          {bars.length > 0 ? (
            <div className="border-b border-line px-2 py-2 md:px-4">
              <StageGainsChart bars={bars} />
            </div>
          ) : (
            <p className="border-b border-line px-4 py-3 text-sm text-ink-muted md:px-5">The chart appears once two stages have a reference run.</p>
          )}
          <DataTable caption="Gains and cost per hp of each stage of this bike" columns={columns} data={rows} getRowId={(r) => r.stageId} maxHeight={null} className="rounded-none border-0" />
          {unmeasured && <p className="px-4 py-2 text-sm text-ink-muted md:px-5">A stage without a reference run shows no figures; its cost counts towards the next measured stage.</p>}
        </>
      )}
    </Card>
  );
}
