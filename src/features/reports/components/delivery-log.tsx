import { useQuery } from '@tanstack/react-query';
import { Badge, Card, EmptyState, ErrorState, LoadingState } from '@/components/ui';
import { formatDateTime } from '@shared/format';
import { reportQueries } from '../api/report-queries';

/** Every attempt to e-mail this report (all versions), newest first. */
export function DeliveryLog({ reportId }: { reportId: string }) {
  const q = useQuery(reportQueries.deliveries(reportId));
  return (
    <Card title="Send log">
      {q.isPending ? (
        <LoadingState compact message="Loading the send log…" />
      ) : q.isError ? (
        <ErrorState error={q.error} onRetry={() => void q.refetch()} />
      ) : q.data.length === 0 ? (
        <EmptyState icon="inbox" title="Not sent yet" message="Use “Send to customer” to e-mail the PDF with a share link." />
      ) : (
        <ul className="m-0 list-none divide-y divide-line p-0">
          {q.data.map((d) => (
            <li key={d.id} className="flex flex-wrap items-start justify-between gap-2 py-2 text-sm">
              <div className="min-w-0">
                <div className="font-medium break-all">{d.to}</div>
                <div className="text-ink-subtle">
                  <span className="num">{formatDateTime(d.createdAt)}</span> · v{d.reportVersion}
                  {d.sentByName ? ` · by ${d.sentByName}` : ''}
                </div>
                {d.error ? <div className="text-loss">{d.error}</div> : null}
              </div>
              <Badge tone={d.status === 'sent' ? 'gain' : d.status === 'queued' ? 'neutral' : 'loss'}>{d.status === 'sent' ? 'Sent' : d.status === 'queued' ? 'Queued' : 'Failed'}</Badge>
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}
