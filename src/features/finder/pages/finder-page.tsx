import { useInfiniteQuery } from '@tanstack/react-query';
import { useSearchParams } from 'react-router-dom';
import { Button, EmptyState, ErrorState, LoadingState, PageHeader } from '@/components/ui';
import { formatCount } from '@shared/format';
import { finderQueries, type FinderFilters } from '../api/finder-queries';
import { FinderFiltersForm } from '../components/finder-filters-form';
import { BuildResultsTable, type BuildSort } from '../components/build-results-table';
import { FinderCharts } from '../components/finder-charts';
import { usePageTitle } from '@/lib/page-title';

/** Build finder: search the shop's past builds; filters live in the URL so a search can be shared. */
export default function FinderPage() {
  usePageTitle('Build finder');
  const [params, setParams] = useSearchParams();
  const filters: FinderFilters = Object.fromEntries(params.entries());
  const sort: BuildSort = (filters.sort as BuildSort) || (filters.engine ? 'similarity' : 'gain');
  const query = useInfiniteQuery(finderQueries.search(filters));
  const items = query.data?.pages.flatMap((p) => p.items) ?? [];

  return (
    <div className="grid min-w-0 gap-6">
      <PageHeader title="Build finder" subtitle="What past builds in this shop measured: find similar setups and what each stage added." />
      <FinderFiltersForm key={params.toString()} initial={filters} onSearch={(f) => setParams(f)} busy={query.isFetching && !query.isFetchingNextPage} />
      <section aria-labelledby="finder-results" className="grid min-w-0 gap-3">
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h2 id="finder-results" className="text-lg font-semibold text-ink">
            Results
          </h2>
          {query.isSuccess && (
            <p className="text-sm text-ink-muted" aria-live="polite">
              {formatCount(items.length, 'build')} shown{query.hasNextPage ? ', more available' : ''}. Gains are against each bike’s own baseline.
            </p>
          )}
        </div>
        {query.isPending ? (
          <LoadingState message="Searching past builds…" />
        ) : query.isError ? (
          <ErrorState title="The search did not work" error={query.error} onRetry={() => query.refetch()} isRetrying={query.isFetching} />
        ) : items.length === 0 ? (
          <EmptyState title="No builds match" message="Loosen a filter, or check the spelling of the engine family." />
        ) : (
          <>
            <FinderCharts items={items} />
            <BuildResultsTable items={items} sort={sort} onSortChange={(s) => setParams({ ...filters, sort: s })} isLoading={query.isFetching && !query.isFetchingNextPage} />
            {query.hasNextPage && (
              <div>
                <Button variant="secondary" onClick={() => query.fetchNextPage()} loading={query.isFetchingNextPage} loadingText="Loading…">
                  Load more builds
                </Button>
              </div>
            )}
          </>
        )}
      </section>
    </div>
  );
}
