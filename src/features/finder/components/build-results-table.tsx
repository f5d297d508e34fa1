import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import { createColumnHelper, type SortingState } from '@tanstack/react-table';
import { DataTable } from '@/components/ui';
import { paths } from '@/config/paths';
import { formatDate, formatGain, formatMoney, formatNumber } from '@shared/format';
import type { BuildItemDto } from '../api/finder-queries';
import { categoryLabel, formatDisplacement } from './format-build';

export type BuildSort = 'similarity' | 'gain' | 'date';
const col = createColumnHelper<BuildItemDto>();
const SORT_BY_COLUMN: Record<string, BuildSort> = { score: 'similarity', gain: 'gain', date: 'date' };

export interface BuildResultsTableProps {
  items: BuildItemDto[];
  sort: BuildSort;
  onSortChange: (sort: BuildSort) => void;
  isLoading?: boolean;
  emptyMessage?: string;
}

/** Builds (bike + stage) with their gains; sortable by similarity, gain or date, always best first. */
export function BuildResultsTable({ items, sort, onSortChange, isLoading, emptyMessage }: BuildResultsTableProps) {
  const columns = useMemo(
    () => [
      col.accessor((b) => `${b.make} ${b.model}`, {
        id: 'bike',
        header: 'Bike',
        enableSorting: false,
        meta: { priority: 'key' },
        cell: ({ row }) => (
          <Link to={paths.bike(row.original.bikeId)} className="font-semibold text-accent underline-offset-2 hover:underline">
            {row.original.year ? `${row.original.year} ` : ''}
            {row.original.make} {row.original.model}
          </Link>
        ),
      }),
      col.accessor('engineFamily', { header: 'Engine', enableSorting: false, meta: { priority: 'extra' }, cell: (c) => c.getValue() ?? '—' }),
      col.accessor('displacementCc', { header: 'Displacement', enableSorting: false, meta: { numeric: true, priority: 'extra' }, cell: (c) => formatDisplacement(c.getValue()) }),
      col.accessor('stageName', { header: 'Stage', enableSorting: false }),
      col.accessor('parts', {
        header: 'Build',
        enableSorting: false,
        meta: { wrap: true },
        cell: (c) => [...new Set(c.getValue().map((p) => categoryLabel(p.category)))].join(', ') || '—',
      }),
      col.accessor('peakPowerGainHp', { id: 'gain', header: 'Peak gain', meta: { numeric: true }, cell: (c) => formatGain(c.getValue()) }),
      col.accessor('averagePowerGainHp', { header: 'Average gain', enableSorting: false, meta: { numeric: true, priority: 'extra' }, cell: (c) => formatGain(c.getValue()) }),
      col.accessor('areaGainPct', { header: 'Area gain', enableSorting: false, meta: { numeric: true, priority: 'extra' }, cell: (c) => (c.getValue() === null ? '—' : `${formatNumber(c.getValue(), { decimals: 1, signed: true })} %`) }),
      col.accessor('cumulativeCostCents', { header: 'Build cost', enableSorting: false, meta: { numeric: true }, cell: (c) => formatMoney(c.getValue(), { minorUnits: true, wholeUnits: true }) }),
      col.accessor('date', { id: 'date', header: 'Date', meta: { numeric: true }, cell: (c) => formatDate(c.getValue()) }),
      col.accessor('score', { id: 'score', header: 'Match', meta: { numeric: true }, cell: (c) => formatNumber(c.getValue(), { decimals: 2 }) }),
    ],
    [],
  );
  const columnId = Object.entries(SORT_BY_COLUMN).find(([, s]) => s === sort)?.[0] ?? 'gain';
  const sorting: SortingState = [{ id: columnId, desc: true }];
  return (
    <DataTable
      caption="Matching builds"
      columns={columns}
      data={items}
      getRowId={(b) => b.stageId}
      sorting={sorting}
      onSortingChange={(updater) => {
        const next = typeof updater === 'function' ? updater(sorting) : updater;
        // Always best first: a click on a column picks it; a click on the current one keeps it.
        const id = next[0]?.id ?? columnId;
        onSortChange(SORT_BY_COLUMN[id] ?? sort);
      }}
      isLoading={isLoading}
      emptyMessage={emptyMessage}
      maxHeight={null}
      className="min-w-0 max-w-full"
    />
  );
}
