import { useState, type ReactNode } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { STAFF, WORKSHOP } from '@shared/roles';
import { Button, ConfirmDialog, EmptyState, ErrorState, Icon, LoadingState, PageHeader, useToast } from '@/components/ui';
import { ApiError } from '@/lib/api-client';
import { hasRole, useCurrentUser } from '@/lib/auth';
import { formatDate } from '@shared/format';
import { paths } from '@/config/paths';
import { comparisonQueries } from '../api/comparison-queries';
import { useDeleteComparison } from '../api/delete-comparison';
import { ComparisonView } from '../components/comparison-view';
import { usePageTitle } from '@/lib/page-title';

/**
 * A saved comparison with its figures computed now. Customers see their own bikes' comparisons read-only.
 * `actions` (staff only) is what the app layer composes in — the reports feature's "Make gain report".
 */
export default function ComparisonPage({ actions }: { actions?: (comparisonId: string) => ReactNode }) {
  const { comparisonId = '' } = useParams();
  const user = useCurrentUser();
  const isStaff = hasRole(user, STAFF);
  const canDelete = hasRole(user, WORKSHOP);
  const q = useQuery(comparisonQueries.detail(comparisonId));
  usePageTitle(q.data?.comparison.name ?? 'Comparison');
  const del = useDeleteComparison();
  const toast = useToast();
  const navigate = useNavigate();
  const [confirming, setConfirming] = useState(false);

  if (q.isPending) return <LoadingState message="Loading the comparison…" />;
  if (q.isError) {
    if (q.error instanceof ApiError && (q.error.status === 404 || q.error.status === 400)) {
      return <EmptyState title="No such comparison" message="It was deleted, or it is not one you can see." action={<Link className="text-accent underline" to={isStaff ? paths.comparisons : paths.home}>{isStaff ? 'All comparisons' : 'Home'}</Link>} />;
    }
    return <ErrorState error={q.error} onRetry={() => q.refetch()} isRetrying={q.isFetching} />;
  }
  const { comparison: c, preview, previewError } = q.data;
  const rebuild = `${paths.newComparison}?${new URLSearchParams({ runIds: c.runIds.join(','), baselineRunId: c.baselineRunId }).toString()}`;

  return (
    <>
      <PageHeader
        back={
          <Link to={isStaff ? paths.comparisons : paths.bike(c.bikeId)} className="focus-ring inline-flex items-center gap-1 rounded-control text-ink-muted hover:text-ink">
            <Icon name="chevron-left" size={16} /> {isStaff ? 'Comparisons' : c.bikeLabel}
          </Link>
        }
        title={c.name}
        subtitle={
          <>
            <Link className="underline-offset-2 hover:underline" to={paths.bike(c.bikeId)}>
              {c.bikeLabel}
            </Link>{' '}
            · saved {formatDate(c.createdAt)}
            {c.createdByName ? ` by ${c.createdByName}` : ''}
          </>
        }
        secondaryActions={
          <>
            {isStaff && (
              <Link to={rebuild} className="focus-ring inline-flex items-center rounded-control border border-line-strong px-3 py-2 font-medium hover:bg-paper-sunk">
                Open in builder
              </Link>
            )}
            {canDelete && (
              <Button variant="danger" onClick={() => setConfirming(true)}>
                Delete
              </Button>
            )}
          </>
        }
      />
      {c.note && <p className="mb-4 max-w-3xl whitespace-pre-line text-ink">{c.note}</p>}
      {preview ? (
        <ComparisonView preview={preview} name={c.name} />
      ) : (
        <ErrorState title="The figures cannot be computed now" message={previewError?.message ?? 'Try again in a moment.'} onRetry={() => q.refetch()} isRetrying={q.isFetching} />
      )}
      {isStaff && actions ? <div className="mt-6">{actions(c.id)}</div> : null}
      <ConfirmDialog
        open={confirming}
        onCancel={() => setConfirming(false)}
        title={`Delete “${c.name}”?`}
        confirmLabel="Delete comparison"
        tone="danger"
        isConfirming={del.isPending}
        onConfirm={async () => {
          try {
            await del.mutateAsync(c.id);
            toast.success('Comparison deleted');
            navigate(paths.comparisons);
          } catch (err) {
            toast.error(err instanceof Error ? err.message : 'The comparison was not deleted');
          }
        }}
      >
        The runs stay in the archive; only this saved comparison goes. Reports already sent are not affected.
      </ConfirmDialog>
    </>
  );
}
