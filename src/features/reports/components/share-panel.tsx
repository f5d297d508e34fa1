import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Badge, Button, Card, ConfirmDialog, EmptyState, ErrorState, LoadingState, SelectField, useToast } from '@/components/ui';
import { formatCount, formatDate, formatDateTime } from '@shared/format';
import { reportQueries } from '../api/report-queries';
import { useCreateShare } from '../api/create-share';
import { useRevokeShare } from '../api/revoke-share';
import type { ShareLinkView } from '../api/types';

const EXPIRY_OPTIONS = [
  { value: '7', label: '7 days' },
  { value: '30', label: '30 days' },
  { value: '90', label: '90 days' },
  { value: '365', label: 'One year' },
];
const TONE = { active: 'gain', expired: 'neutral', revoked: 'loss' } as const;

/**
 * Share links of a report: create (and copy the new link once), list with views, revoke. `sentLink`
 * is the link the last send put in the e-mail, shown the same way.
 */
export function SharePanel({ reportId, canManage, sentLink = null }: { reportId: string; canManage: boolean; sentLink?: string | null }) {
  const links = useQuery(reportQueries.shares(reportId));
  const create = useCreateShare(reportId);
  const revoke = useRevokeShare(reportId);
  const toast = useToast();
  const [days, setDays] = useState('30');
  const [created, setCreated] = useState<string | null>(null);
  const fresh = created ?? sentLink;
  const [confirm, setConfirm] = useState<ShareLinkView | null>(null);

  const copy = async (url: string) => {
    try {
      await navigator.clipboard.writeText(url);
      toast.success('Link copied');
    } catch {
      toast.info('Select the link and copy it by hand');
    }
  };

  return (
    <Card title="Share links" description="Anyone with a link sees this report's figures, chart and PDF — nothing else of the shop.">
      {canManage ? (
        <div className="flex flex-wrap items-end gap-3">
          <SelectField label="Valid for" options={EXPIRY_OPTIONS} value={days} onChange={(e) => setDays(e.target.value)} containerClassName="w-40" />
          <Button
            variant="primary"
            loading={create.isPending}
            onClick={() => create.mutate({ expiresInDays: Number(days) }, { onSuccess: (l) => setCreated(l.url), onError: (e) => toast.error(e.message) })}
          >
            Create link
          </Button>
        </div>
      ) : null}
      {fresh ? (
        <div className="mt-3 rounded-control border border-line bg-accent-soft p-3" role="status">
          <p className="m-0 text-sm font-medium">{created ? 'New link — copy it now; for safety it is shown only once.' : 'Link sent with the e-mail — copy it now; for safety it is shown only once.'}</p>
          <div className="mt-2 flex flex-wrap items-center gap-2">
            <input readOnly value={fresh} aria-label="New share link" className="min-w-0 flex-1 rounded-control border border-line-strong bg-paper-raised px-2 py-1 font-mono text-sm" onFocus={(e) => e.currentTarget.select()} />
            <Button size="sm" onClick={() => void copy(fresh)}>
              Copy link
            </Button>
          </div>
        </div>
      ) : null}
      <div className="mt-4">
        {links.isPending ? (
          <LoadingState compact message="Loading links…" />
        ) : links.isError ? (
          <ErrorState error={links.error} onRetry={() => void links.refetch()} />
        ) : links.data.length === 0 ? (
          <EmptyState icon="inbox" title="No share links yet" message="Create one, or send the report: sending adds a link to the e-mail." />
        ) : (
          <div className="overflow-x-auto" role="region" aria-label="Share links" tabIndex={0}>
            <table className="w-full text-sm">
              <thead>
                <tr className="border-b border-line text-left text-ink-subtle">
                  <th className="py-2 pr-3 font-medium">Created</th>
                  <th className="py-2 pr-3 font-medium">Expires</th>
                  <th className="py-2 pr-3 font-medium">Status</th>
                  <th className="py-2 pr-3 text-right font-medium">Views</th>
                  <th className="py-2 font-medium">
                    <span className="sr-only">Actions</span>
                  </th>
                </tr>
              </thead>
              <tbody>
                {links.data.map((l) => (
                  <tr key={l.id} className="border-b border-line">
                    <td className="num py-2 pr-3">
                      {formatDateTime(l.createdAt)}
                      {l.reportVersion ? <span className="text-ink-subtle"> · v{l.reportVersion}</span> : null}
                    </td>
                    <td className="num py-2 pr-3">{formatDate(l.expiresAt)}</td>
                    <td className="py-2 pr-3">
                      <Badge tone={TONE[l.status]}>{l.status}</Badge>
                    </td>
                    <td className="num py-2 pr-3 text-right" title={l.lastViewedAt ? `Last viewed ${formatDateTime(l.lastViewedAt)}` : 'Not viewed yet'}>
                      {formatCount(l.viewCount, 'view')}
                    </td>
                    <td className="py-2 text-right">
                      {canManage && l.status === 'active' ? (
                        <Button size="sm" variant="ghost" onClick={() => setConfirm(l)}>
                          Revoke
                        </Button>
                      ) : null}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </div>
      <ConfirmDialog
        open={confirm !== null}
        onCancel={() => setConfirm(null)}
        title="Revoke this link?"
        confirmLabel="Revoke link"
        tone="danger"
        isConfirming={revoke.isPending}
        onConfirm={() => {
          if (!confirm) return;
          revoke.mutate(confirm.id, { onSuccess: () => setConfirm(null), onError: (e) => toast.error(e.message) });
        }}
      >
        Anyone opening it afterwards sees a “link not valid” page. This cannot be undone; you can create a new link.
      </ConfirmDialog>
    </Card>
  );
}
