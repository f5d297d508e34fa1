import { useEffect, useMemo, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { type PaginationState, type SortingState } from '@tanstack/react-table';
import { RUN_STATUSES, type RunStatusId } from '@shared/schemas/run';
import { Button, Caution, DataTable, ErrorState, Icon, PageHeader, SelectField, TextField, useDebouncedValue } from '@/components/ui';
import { formatDate } from '@shared/format';
import { useCurrentUser } from '@/lib/auth';
import { paths } from '@/config/paths';
import { bikeLabel, lookupQueries, runQueries, type RunFilters } from '../api/runs/run-queries';
import { stageQueries } from '../api/stages/stage-queries';
import { RUN_STATUS_LABELS, RunStatusBadge } from '../components/run-status';
import { runFileLabel } from '@shared/labels';
import { peakPowerColumn, peakTorqueColumn, runColumn, runName } from '../components/run-columns';
import { usePageTitle } from '@/lib/page-title';

const col = runColumn;
const FILTER_KEYS = ['bikeId', 'customerId', 'stageId', 'tag', 'status', 'from', 'to'] as const;
const DEFAULT_SORT = '-createdAt';

function filtersFrom(params: URLSearchParams): RunFilters {
  const f: RunFilters = {};
  for (const k of FILTER_KEYS) {
    const v = params.get(k);
    if (v) (f as Record<string, string>)[k] = v;
  }
  f.sort = params.get('sort') || DEFAULT_SORT;
  f.page = Math.max(1, Number(params.get('page')) || 1);
  f.pageSize = Number(params.get('pageSize')) || 25;
  return f;
}

/** Hidden below the given width, so the table fits a 10-inch tablet and a 1366 px laptop. */
const fromLg = { headerClassName: 'hidden lg:table-cell', cellClassName: 'hidden lg:table-cell' };
const from2xl = { headerClassName: 'hidden 2xl:table-cell', cellClassName: 'hidden 2xl:table-cell' };

/**
 * Peaks come right after the run's name so they stay on screen at every width. On narrower screens
 * the customer goes first (shown under the bike), then date, stage and tags (shown under the run).
 */
const columns = [
  col.accessor('createdAt', { id: 'createdAt', header: 'Uploaded', meta: fromLg, cell: (c) => <span className="num">{formatDate(c.getValue())}</span> }),
  col.accessor(runName, {
    id: 'name',
    header: 'Run',
    enableSorting: false,
    cell: (c) => (
      <>
        <Link to={paths.run(c.row.original.id)} title={c.getValue()} className="block max-w-56 truncate font-semibold text-accent underline-offset-2 hover:underline">
          {c.getValue()}
        </Link>
        <span className="block max-w-56 truncate text-sm text-ink-muted" title={runFileLabel(c.row.original)}>
          {runFileLabel(c.row.original)}
        </span>
        {/* Below 1024 px the date and stage columns give way; show them here. */}
        <span className="num block text-xs text-ink-subtle lg:hidden">
          {formatDate(c.row.original.createdAt)} · {c.row.original.stageName ?? 'no stage'}
        </span>
      </>
    ),
  }),
  peakPowerColumn(),
  peakTorqueColumn(),
  col.accessor('bikeLabel', {
    header: 'Bike',
    enableSorting: false,
    cell: (c) => (
      <span className="block min-w-28 whitespace-normal">
        {c.getValue()}
        {/* The customer column gives way below 1536 px; keep the name under the bike. */}
        <span className="block text-xs text-ink-subtle 2xl:hidden">{c.row.original.customerName}</span>
      </span>
    ),
  }),
  col.accessor('customerName', { header: 'Customer', enableSorting: false, meta: from2xl }),
  col.accessor('stageName', { header: 'Stage', enableSorting: false, meta: fromLg, cell: (c) => c.getValue() ?? <span className="text-ink-subtle">none</span> }),
  col.accessor('status', { header: 'Status', enableSorting: false, cell: (c) => <RunStatusBadge status={c.getValue()} deleted={Boolean(c.row.original.deletedAt)} /> }),
  col.accessor('tags', { header: 'Tags', enableSorting: false, meta: { wrap: true, ...fromLg }, cell: (c) => c.getValue().join(', ') }),
];

/** Every run of the shop, filtered and sorted on the server; the URL keeps the filters. */
export function RunListPage() {
  usePageTitle('Runs');
  const user = useCurrentUser();
  const [params, setParams] = useSearchParams();
  const filters = useMemo(() => filtersFrom(params), [params]);
  // "From" after "To" can match nothing; say so instead of asking the server.
  const badRange = Boolean(filters.from && filters.to && filters.from > filters.to);
  const runs = useQuery({ ...runQueries.list(filters), enabled: !badRange });
  const bikes = useQuery(lookupQueries.allBikes());
  const customers = useQuery(lookupQueries.customers());
  const stages = useQuery({ ...stageQueries.list(filters.bikeId ?? ''), enabled: Boolean(filters.bikeId) });

  const update = (change: Record<string, string | number | undefined>, resetPage = true) => {
    const p = new URLSearchParams(params);
    for (const [k, v] of Object.entries(change)) {
      if (v === undefined || v === '') p.delete(k);
      else p.set(k, String(v));
    }
    if (resetPage && !('page' in change)) p.delete('page');
    setParams(p, { replace: true });
  };

  // The tag applies as you type, once typing pauses; the URL keeps it.
  const [tagText, setTagText] = useState(filters.tag ?? '');
  const debouncedTag = useDebouncedValue(tagText.trim(), 400);
  useEffect(() => {
    if (debouncedTag !== (filters.tag ?? '')) update({ tag: debouncedTag });
    // Only a settled change of the box updates the URL.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [debouncedTag]);
  useEffect(() => {
    // The URL changed from elsewhere (Clear filters, back button): show it in the box.
    if ((filters.tag ?? '') !== debouncedTag) setTagText(filters.tag ?? '');
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [filters.tag]);

  const sort = filters.sort ?? DEFAULT_SORT;
  const sorting: SortingState = [{ id: sort.replace(/^-/, ''), desc: sort.startsWith('-') }];
  const pagination: PaginationState = { pageIndex: (filters.page ?? 1) - 1, pageSize: filters.pageSize ?? 25 };
  const hasFilters = FILTER_KEYS.some((k) => params.get(k));

  return (
    <div className="mx-auto max-w-7xl">
      <PageHeader
        title="Runs"
        subtitle="Every pull in the archive. Filter by bike, customer, stage, tag, date or status."
        action={
          user.role !== 'desk' && (
            <Link to={paths.upload} className="inline-flex min-h-11 items-center gap-2 rounded-control bg-accent px-4 font-semibold text-white hover:bg-accent-hover">
              <Icon name="upload" size={18} /> Upload runs
            </Link>
          )
        }
      />
      <form role="search" aria-label="Filter runs" className="mb-4 grid items-end gap-3 sm:grid-cols-2 lg:grid-cols-4" onSubmit={(e) => e.preventDefault()}>
        <SelectField
          label="Bike"
          placeholder="All bikes"
          value={filters.bikeId ?? ''}
          onChange={(e) => update({ bikeId: e.target.value, stageId: undefined })}
          options={(bikes.data ?? []).map((b) => ({ value: b.id, label: `${bikeLabel(b)} · ${b.customerName}` }))}
        />
        <SelectField
          label="Customer"
          placeholder="All customers"
          value={filters.customerId ?? ''}
          onChange={(e) => update({ customerId: e.target.value })}
          options={(customers.data ?? []).map((c) => ({ value: c.id, label: c.name }))}
        />
        <SelectField
          label="Build stage"
          placeholder="All stages"
          hint={filters.bikeId ? undefined : 'Choose a bike to filter by its stages.'}
          disabled={!filters.bikeId}
          value={filters.stageId ?? ''}
          onChange={(e) => update({ stageId: e.target.value })}
          options={(stages.data ?? []).map((s) => ({ value: s.id, label: s.name }))}
        />
        <SelectField
          label="Status"
          placeholder="Any status"
          value={filters.status ?? ''}
          onChange={(e) => update({ status: e.target.value as RunStatusId })}
          options={RUN_STATUSES.map((s) => ({ value: s, label: RUN_STATUS_LABELS[s] }))}
        />
        <TextField label="Run tag" type="search" value={tagText} onChange={(e) => setTagText(e.target.value)} hint="One whole tag, e.g. hot day. Applies as you type." />
        <TextField label="From" type="date" value={filters.from ?? ''} max={filters.to} onChange={(e) => update({ from: e.target.value })} />
        <TextField label="To" type="date" value={filters.to ?? ''} min={filters.from} onChange={(e) => update({ to: e.target.value })} error={badRange ? '“To” is before “From”.' : undefined} />
        <div className="flex items-end">
          <Button variant="ghost" disabled={!hasFilters} onClick={() => setParams(new URLSearchParams(), { replace: true })}>
            Clear filters
          </Button>
        </div>
      </form>
      {badRange ? (
        <Caution kind="notice" title="The dates are the wrong way round">
          <p>
            “From” ({formatDate(filters.from)}) is after “To” ({formatDate(filters.to)}), so no run could match.
          </p>
          <Button className="mt-2" size="sm" onClick={() => update({ from: filters.to, to: filters.from })}>
            Swap the dates
          </Button>
        </Caution>
      ) : runs.isError ? (
        <ErrorState error={runs.error} onRetry={() => runs.refetch()} isRetrying={runs.isFetching} />
      ) : (
        <DataTable
          caption="Runs"
          columns={columns}
          data={runs.data?.items ?? []}
          getRowId={(r) => r.id}
          isLoading={runs.isFetching}
          totalRows={runs.data?.total}
          totalIsEstimate={runs.data?.totalIsEstimate}
          sorting={sorting}
          onSortingChange={(updater) => {
            const next = typeof updater === 'function' ? updater(sorting) : updater;
            const s = next[0];
            update({ sort: s ? `${s.desc ? '-' : ''}${s.id}` : undefined });
          }}
          pagination={pagination}
          onPaginationChange={(updater) => {
            const next = typeof updater === 'function' ? updater(pagination) : updater;
            update({ page: next.pageIndex + 1, pageSize: next.pageSize }, false);
          }}
          emptyMessage={hasFilters ? 'No run matches these filters.' : 'No runs yet. Upload a session’s files to start the archive.'}
        />
      )}
    </div>
  );
}
