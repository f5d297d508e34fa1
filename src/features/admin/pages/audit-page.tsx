import { useInfiniteQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { Button, DataTable, ErrorState, PageHeader } from '@/components/ui';
import { formatDateTime } from '@shared/format';
import { adminQueries, type AuditEntry } from '../api/admin-queries';

/** "customer.update" → "Customer updated"; unknown verbs are shown as they are. */
const VERBS: Record<string, string> = { create: 'created', update: 'updated', delete: 'deleted' };
function describeAction(action: string) {
  const [thing, verb] = action.split('.');
  if (!verb) return action;
  const noun = thing.charAt(0).toUpperCase() + thing.slice(1).replace(/-/g, ' ');
  return `${noun} ${VERBS[verb] ?? verb.replace(/-/g, ' ')}`;
}

function summarize(details: Record<string, unknown> | null) {
  if (!details) return '';
  return Object.entries(details)
    .filter(([, v]) => v !== null && v !== undefined && v !== '')
    .map(([k, v]) => `${k}: ${typeof v === 'object' ? JSON.stringify(v) : String(v)}`)
    .join(' · ');
}

const col = createColumnHelper<AuditEntry>();
const columns = [
  col.accessor('at', { header: 'When', meta: { numeric: true }, cell: (c) => <time dateTime={c.getValue()}>{formatDateTime(c.getValue())}</time> }),
  col.accessor('userName', { header: 'Who', cell: (c) => c.getValue() ?? <span className="text-ink-subtle">System</span> }),
  col.accessor('action', { header: 'What', cell: (c) => describeAction(c.getValue()) }),
  col.accessor('details', { header: 'Details', meta: { wrap: true }, cell: (c) => <span className="text-ink-muted">{summarize(c.getValue())}</span> }),
];

/** Owner only: the guard is the settings layout route (../routes.tsx). */
export default function AuditPage() {
  const audit = useInfiniteQuery(adminQueries.audit());
  const rows = audit.data?.pages.flat() ?? [];
  return (
    <>
      <PageHeader title="Audit log" subtitle="Who changed what in this shop, newest first. Entries cannot be edited or removed." />
      {audit.isError && !audit.data ? (
        <ErrorState error={audit.error} onRetry={() => audit.refetch()} isRetrying={audit.isFetching} />
      ) : (
        <>
          <DataTable caption="Audit log" columns={columns} data={rows} getRowId={(r) => r.id} isLoading={audit.isPending} maxHeight={null} emptyMessage="Nothing recorded yet. Changes to customers, bikes, users and settings appear here." />
          {audit.hasNextPage && (
            <div className="mt-4 flex justify-center">
              <Button onClick={() => audit.fetchNextPage()} loading={audit.isFetchingNextPage} loadingText="Loading…">
                Show older entries
              </Button>
            </div>
          )}
        </>
      )}
    </>
  );
}
