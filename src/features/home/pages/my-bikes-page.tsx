import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { EmptyState, ErrorState, Icon, LoadingState, PageHeader } from '@/components/ui';
import { formatCc, formatCubicInches } from '@shared/units-display';
import { useCurrentUser } from '@/lib/auth';
import { paths } from '@/config/paths';
import { shopQuery } from '@/lib/shop-query';
import { homeQueries } from '../api/home-queries';
import { FiguresNotice } from '../components/cautions';
import { bikeTitle } from '../components/bike-title';
import { usePageTitle } from '@/lib/page-title';

/** A rider's start page: their own bikes, read-only, each leading to its history. */
export default function MyBikesPage() {
  usePageTitle('My bikes');
  const user = useCurrentUser();
  const bikes = useQuery(homeQueries.myBikes());
  const shop = useQuery(shopQuery());

  return (
    <>
      <PageHeader title="My bikes" subtitle={`Hello ${user.name}. These are the bikes ${shop.data?.name ?? 'the shop'} has on file for you.`} />
      {bikes.isPending ? (
        <LoadingState message="Loading your bikes…" />
      ) : bikes.isError ? (
        <ErrorState error={bikes.error} onRetry={() => bikes.refetch()} isRetrying={bikes.isFetching} />
      ) : bikes.data.items.length === 0 ? (
        <EmptyState title="No bikes on file yet" message="When the shop books your bike in, it appears here with its dyno runs and reports." />
      ) : (
        <ul className="grid gap-4 md:grid-cols-2 xl:grid-cols-3" aria-label="My bikes">
          {bikes.data.items.map((b) => (
            <li key={b.id}>
              <Link
                to={paths.bike(b.id)}
                className="focus-ring flex h-full items-start justify-between gap-3 rounded-card border border-line bg-paper-raised p-4 shadow-card hover:border-accent"
              >
                <div className="min-w-0">
                  <p className="text-lg font-semibold text-ink">{bikeTitle(b)}</p>
                  <p className="num mt-1 text-ink-muted">
                    {[
                      b.engineFamily,
                      b.displacementCc !== null ? `${formatCc(b.displacementCc)} · ${formatCubicInches(b.displacementCc)}` : null,
                      b.cylinders !== null ? `${b.cylinders} cyl.` : null,
                    ]
                      .filter(Boolean)
                      .join(' · ') || 'No engine details yet'}
                  </p>
                </div>
                <Icon name="chevron-right" size={20} className="mt-1 shrink-0 text-accent" />
              </Link>
            </li>
          ))}
        </ul>
      )}
      <div className="mt-8 max-w-3xl">
        <FiguresNotice />
      </div>
    </>
  );
}
