import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { Badge, Button, DataTable, ErrorState, LoadingState, useToast } from '@/components/ui';
import { formatDateTime } from '@shared/format';
import { mailLogQuery, useRetryMail, type MailLogEntry } from '../api/retry-mail';

const KIND_LABEL: Record<string, string> = { invite: 'Invitation', reset: 'Password reset', report: 'Gain report', notice: 'Notice' };

function StatusCell({ m }: { m: MailLogEntry }) {
  const tone = m.status === 'sent' ? 'gain' : m.status === 'failed' ? 'loss' : 'neutral';
  const label = m.status === 'sent' ? 'Sent' : m.status === 'failed' ? 'Failed' : 'Queued';
  return (
    <div className="space-y-1">
      <Badge tone={tone}>{label}</Badge>
      {m.error ? <div className="text-sm text-ink-muted">{m.error}</div> : null}
      {m.status === 'queued' && m.nextAttemptAt ? (
        <div className="text-sm text-ink-subtle">
          Next try <time dateTime={m.nextAttemptAt}>{formatDateTime(m.nextAttemptAt)}</time>
        </div>
      ) : null}
    </div>
  );
}

function RetryButton({ m }: { m: MailLogEntry }) {
  const retry = useRetryMail();
  const toast = useToast();
  if (!m.retryable && m.status !== 'queued') return m.kind === 'report' && m.status === 'failed' ? <span className="text-sm text-ink-subtle">Send the report again</span> : null;
  if (m.kind === 'report') return null;
  return (
    <Button
      size="sm"
      variant="ghost"
      loading={retry.isPending}
      loadingText="Queueing…"
      onClick={() => retry.mutate(m.id, { onSuccess: () => toast.success(`Queued again for ${m.to}`), onError: (e) => toast.error(e instanceof Error ? e.message : 'Could not queue it again') })}
    >
      {m.status === 'queued' ? 'Try now' : 'Retry'}
    </Button>
  );
}

/** Every message Pullbook queued for the shop, with its state; failed ones can be queued again. */
export function SendLog() {
  const log = useQuery(mailLogQuery());
  const col = createColumnHelper<MailLogEntry>();
  const columns = [
    col.accessor('createdAt', { header: 'Queued', meta: { numeric: true }, cell: (c) => <time dateTime={c.getValue()}>{formatDateTime(c.getValue())}</time> }),
    col.accessor('kind', { header: 'Kind', cell: (c) => KIND_LABEL[c.getValue()] ?? c.getValue() }),
    col.accessor('to', { header: 'To' }),
    col.accessor('subject', { header: 'Subject', meta: { wrap: true } }),
    col.display({ id: 'status', header: 'Status', meta: { wrap: true }, cell: (c) => <StatusCell m={c.row.original} /> }),
    col.accessor('attempts', { header: 'Tries', meta: { numeric: true } }),
    col.display({ id: 'retry', header: () => <span className="sr-only">Actions</span>, cell: (c) => <RetryButton m={c.row.original} /> }),
  ];
  if (log.isPending) return <LoadingState message="Loading the send log…" />;
  if (log.isError) return <ErrorState error={log.error} onRetry={() => log.refetch()} isRetrying={log.isFetching} />;
  return <DataTable caption="Send log" columns={columns} data={log.data} getRowId={(m) => m.id} maxHeight={null} emptyMessage="Nothing queued yet. Invitations, reset links and reports show up here." />;
}
