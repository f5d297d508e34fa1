import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { Button, Caution, DataTable, Dialog, ErrorState, LoadingState, PageHeader } from '@/components/ui';
import { formatDateTime, formatFileSize } from '@shared/format';
import { adminQueries, outboxAttachmentUrl, type OutboxItem } from '../api/admin-queries';
import { usePageTitle } from '@/lib/page-title';
import { SendLog } from '../components/send-log';

function Attachments({ message }: { message: OutboxItem }) {
  if (!message.attachments.length) return <span className="text-ink-subtle">None</span>;
  return (
    <ul className="space-y-1">
      {message.attachments.map((a, i) => (
        <li key={i}>
          <a href={outboxAttachmentUrl(message.id, i)} download={a.filename} className="focus-ring rounded-control text-accent underline">
            {a.filename}
          </a>{' '}
          <span className="num text-sm text-ink-subtle">({formatFileSize(a.size)})</span>
        </li>
      ))}
    </ul>
  );
}

/** Owner only: the guard is the settings layout route (../routes.tsx). */
export default function OutboxPage() {
  usePageTitle('Outbox');
  const outbox = useQuery(adminQueries.outbox());
  const [openId, setOpenId] = useState<string | null>(null);
  const col = createColumnHelper<OutboxItem>();
  const columns = [
    col.accessor('receivedAt', { header: 'Sent', meta: { numeric: true }, cell: (c) => <time dateTime={c.getValue()}>{formatDateTime(c.getValue())}</time> }),
    col.accessor('to', { header: 'To' }),
    col.accessor('subject', {
      header: 'Subject',
      meta: { wrap: true },
      cell: (c) => (
        <button type="button" className="focus-ring rounded-control text-left font-semibold text-accent underline-offset-2 hover:underline" onClick={() => setOpenId(c.row.original.id)}>
          {c.getValue() || '(no subject)'}
        </button>
      ),
    }),
    col.display({ id: 'attachments', header: 'Attachments', cell: (c) => <Attachments message={c.row.original} /> }),
  ];

  return (
    <>
      <PageHeader
        title="Outbox"
        subtitle="Mail Pullbook has queued — invitations, reset links, gain reports — with whether it went, and below, what the local mail catcher received."
        secondaryActions={
          <Button onClick={() => outbox.refetch()} loading={outbox.isFetching && !outbox.isPending} loadingText="Checking…">
            Check for new mail
          </Button>
        }
      />
      <section aria-labelledby="send-log-heading" className="mb-6 space-y-2">
        <h2 id="send-log-heading" className="text-lg font-semibold">
          Send log
        </h2>
        <SendLog />
      </section>
      <h2 className="mb-2 text-lg font-semibold">Received by the mail catcher</h2>
      {outbox.isPending ? (
        <LoadingState message="Loading the outbox…" />
      ) : outbox.isError ? (
        <ErrorState error={outbox.error} onRetry={() => outbox.refetch()} isRetrying={outbox.isFetching} />
      ) : !outbox.data.enabled ? (
        <Caution kind="notice" title="Mail goes to a real relay" level={2}>
          <p>This installation sends e-mail through a real mail server, so Pullbook keeps no copies here. Check the sent items of the shop’s mail account instead.</p>
        </Caution>
      ) : (
        <DataTable caption="Captured mail" columns={columns} data={outbox.data.items} getRowId={(m) => m.id} maxHeight={null} emptyMessage="No mail sent yet. Invitations, reset links and reports show up here." />
      )}
      {openId && <MessageDialog id={openId} onClose={() => setOpenId(null)} />}
    </>
  );
}

function MessageDialog({ id, onClose }: { id: string; onClose: () => void }) {
  const message = useQuery(adminQueries.outboxMessage(id));
  const [formatted, setFormatted] = useState(false);
  return (
    <Dialog open onClose={onClose} size="lg" title={message.data?.subject || 'Message'} footer={<Button onClick={onClose}>Close</Button>}>
      {message.isPending ? (
        <LoadingState compact />
      ) : message.isError ? (
        <ErrorState error={message.error} onRetry={() => message.refetch()} />
      ) : (
        <div className="space-y-4">
          <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm">
            <dt className="text-ink-muted">From</dt>
            <dd className="break-all">{message.data.from}</dd>
            <dt className="text-ink-muted">To</dt>
            <dd className="break-all">{message.data.to}</dd>
            <dt className="text-ink-muted">Sent</dt>
            <dd className="num">{formatDateTime(message.data.receivedAt)}</dd>
            <dt className="text-ink-muted">Attachments</dt>
            <dd>
              <Attachments message={message.data} />
            </dd>
          </dl>
          {message.data.html && (
            <Button size="sm" variant="ghost" aria-pressed={formatted} onClick={() => setFormatted((f) => !f)}>
              {formatted ? 'Show plain text' : 'Show formatted'}
            </Button>
          )}
          {formatted && message.data.html ? (
            // Sandboxed with no permissions: the mail's markup is shown, never run.
            <iframe title="Formatted message" sandbox="" srcDoc={message.data.html} className="h-96 w-full rounded-card border border-line bg-white" />
          ) : (
            <pre className="max-h-[50vh] overflow-auto whitespace-pre-wrap break-words rounded-card border border-line bg-paper-sunk p-3 font-sans text-base">{message.data.text}</pre>
          )}
        </div>
      )}
    </Dialog>
  );
}
