import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { EmptyState, ErrorState, LoadingState, PageHeader } from '@/components/ui';
import { paths } from '@/config/paths';
import { usePageTitle } from '@/lib/page-title';
import { dynoQueries } from '../api/dyno-queries';

/** Which dyno's bay board to show (a tablet is usually left on one). */
export function BayIndexPage() {
  usePageTitle('Bay board');
  const dynos = useQuery(dynoQueries.list());
  return (
    <div className="mx-auto max-w-4xl">
      <PageHeader title="Bay board" subtitle="Pick the dyno this screen hangs beside. Pulls appear on its board as the dyno saves them." />
      {dynos.isPending ? (
        <LoadingState message="Loading dynos…" />
      ) : dynos.isError ? (
        <ErrorState error={dynos.error} onRetry={() => dynos.refetch()} isRetrying={dynos.isFetching} />
      ) : dynos.data.length === 0 ? (
        <EmptyState title="No dynos yet" message="The owner adds the shop’s dynos on the Dynos settings page." />
      ) : (
        <ul className="grid gap-4 sm:grid-cols-2">
          {dynos.data.map((d) => (
            <li key={d.id}>
              <Link to={paths.bayBoard(d.id)} className="focus-ring block rounded-card border border-line bg-paper-raised p-6 text-3xl font-semibold hover:border-accent">
                {d.name}
              </Link>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
