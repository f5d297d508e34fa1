import { useQuery } from '@tanstack/react-query';
import { Link, useSearchParams } from 'react-router-dom';
import { EmptyState, ErrorState, Icon, LoadingState, PageHeader, SimpleTable } from '@/components/ui';
import { formatDate } from '@shared/format';
import { paths } from '@/config/paths';
import { comparisonQueries } from '../api/comparison-queries';
import { usePageTitle } from '@/lib/page-title';

/** Saved comparisons, newest first (optionally `?bikeId=`). */
export default function ComparisonsPage() {
  usePageTitle('Comparisons');
  const [params] = useSearchParams();
  const bikeId = params.get('bikeId') ?? undefined;
  const q = useQuery(comparisonQueries.list({ bikeId }));
  const newLink = bikeId ? `${paths.newComparison}?bikeId=${bikeId}` : paths.newComparison;
  return (
    <>
      <PageHeader
        title="Comparisons"
        subtitle="Saved before-and-after comparisons; gain reports are made from these."
        action={
          <Link to={newLink} className="focus-ring inline-flex items-center gap-2 rounded-control bg-accent px-4 py-2 font-semibold text-white hover:bg-accent-hover">
            <Icon name="plus" size={18} /> New comparison
          </Link>
        }
      />
      {q.isPending ? (
        <LoadingState message="Loading comparisons…" />
      ) : q.isError ? (
        <ErrorState error={q.error} onRetry={() => q.refetch()} isRetrying={q.isFetching} />
      ) : q.data.length === 0 ? (
        <EmptyState title="No saved comparisons yet" message="Build one from a bike’s runs: the previous stage against the latest is suggested." action={<Link className="text-accent underline" to={newLink}>New comparison</Link>} icon="inbox" />
      ) : (
        <SimpleTable columns={['Name', 'Bike', { label: 'Runs', numeric: true }, 'Saved']} caption="Saved comparisons" className="overflow-x-auto rounded-card border border-line bg-paper-raised shadow-card" minWidth="min-w-[36rem]" pad="px-4">
          {q.data.map((c) => (
            <tr key={c.id} className="border-t border-line hover:bg-paper-sunk/60">
              <th scope="row" className="px-4 py-2 text-left">
                <Link to={paths.comparison(c.id)} className="focus-ring rounded-control font-semibold text-accent underline-offset-2 hover:underline">
                  {c.name}
                </Link>
              </th>
              <td className="px-4 py-2">
                <Link to={paths.bike(c.bikeId)} className="focus-ring rounded-control underline-offset-2 hover:underline">
                  {c.bikeLabel}
                </Link>
              </td>
              <td className="px-4 py-2 text-right">{c.runIds.length}</td>
              <td className="px-4 py-2">
                {formatDate(c.createdAt)}
                {c.createdByName ? <span className="text-ink-muted"> · {c.createdByName}</span> : null}
              </td>
            </tr>
          ))}
        </SimpleTable>
      )}
    </>
  );
}
