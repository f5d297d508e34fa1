import { useMemo, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import type { InboxItemDto } from '@shared/schemas/bay';
import { formatDateTime, formatFileSize, formatNumber } from '@shared/format';
import { Button, DataTable, EmptyState, ErrorState, PageHeader } from '@/components/ui';
import { usePageTitle } from '@/lib/page-title';
import { inboxQueries } from '../api/inbox-queries';
import { AssignDialog } from '../components/assign-dialog';

const col = createColumnHelper<InboxItemDto>();

function peaksText(item: InboxItemDto): string {
  if (item.summary.readable === 0) return item.summary.error ?? 'Could not be read yet';
  const peaks = item.summary.peaks.filter((p) => p.hp !== null).map((p) => `${formatNumber(p.hp, { decimals: 1 })} hp`);
  return `${item.summary.pulls} pull${item.summary.pulls === 1 ? '' : 's'}: ${peaks.join(', ')}`;
}

/** Files that arrived from a dyno with nothing on it, waiting for staff to say which bike they belong to. */
export function InboxPage() {
  usePageTitle('Inbox');
  const items = useQuery(inboxQueries.list());
  const [assigning, setAssigning] = useState<InboxItemDto | null>(null);
  const columns = useMemo(
    () => [
      col.accessor('originalName', { header: 'File', cell: (c) => <span className="font-medium">{c.getValue()}</span> }),
      col.accessor('dynoName', { header: 'From', cell: (c) => c.getValue() ?? 'a removed dyno' }),
      col.accessor('receivedAt', { header: 'Arrived', cell: (c) => formatDateTime(c.getValue()) + (c.row.original.repeats ? ` (sent ${c.row.original.repeats + 1}×)` : '') }),
      col.display({ id: 'peaks', header: 'First reading', meta: { wrap: true }, cell: (c) => peaksText(c.row.original) }),
      col.accessor('sizeBytes', { header: 'Size', meta: { align: 'right' }, cell: (c) => formatFileSize(c.getValue()) }),
      col.display({
        id: 'assign',
        header: () => <span className="sr-only">Assign</span>,
        meta: { align: 'right' },
        cell: (c) => (
          <Button size="sm" variant="primary" onClick={() => setAssigning(c.row.original)} aria-label={`Assign ${c.row.original.originalName}`}>
            Assign
          </Button>
        ),
      }),
    ],
    [],
  );
  return (
    <div className="mx-auto max-w-6xl">
      <PageHeader title="Inbox" subtitle="Run files a dyno sent while no bike was set on it. Nothing is guessed: assign each to its bike (and session and stage) and it joins the archive like an upload." />
      {items.isError ? (
        <ErrorState error={items.error} onRetry={() => items.refetch()} isRetrying={items.isFetching} />
      ) : (
        <DataTable
          caption="Files waiting for a bike"
          columns={columns}
          data={items.data ?? []}
          isLoading={items.isLoading}
          maxHeight={null}
          getRowId={(i) => i.id}
          emptyMessage={<EmptyState title="The inbox is empty" message="Every file from the dynos has found its bike." />}
        />
      )}
      <AssignDialog item={assigning} onClose={() => setAssigning(null)} />
    </div>
  );
}
