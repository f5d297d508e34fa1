import { useState, type ReactNode } from 'react';
import { useQuery, type UseQueryResult } from '@tanstack/react-query';
import { Link, useNavigate } from 'react-router-dom';
import type { Page } from '@shared/schemas/common';
import { Button, Card, EmptyState, ErrorState, Icon, LoadingState, PageHeader, SearchInput } from '@/components/ui';
import { formatDate } from '@shared/format';
import { hasRole, useCurrentUser } from '@/lib/auth';
import { paths } from '@/config/paths';
import { homeQueries } from '../api/home-queries';
import { DynoCaution, EngineCaution } from '../components/cautions';
import { bikeTitle } from '../components/bike-title';
import { usePageTitle } from '@/lib/page-title';

/** Staff start page: find someone, jump to the usual jobs, see what came in lately. */
export default function TodayPage() {
  usePageTitle('Today');
  const user = useCurrentUser();
  const navigate = useNavigate();
  const [search, setSearch] = useState('');
  const customers = useQuery(homeQueries.recentCustomers());
  const bikes = useQuery(homeQueries.recentBikes());
  const front = hasRole(user, ['owner', 'desk']);
  const workshop = hasRole(user, ['owner', 'tuner']);
  const today = new Intl.DateTimeFormat('en-US', { weekday: 'long', month: 'long', day: 'numeric' }).format(new Date());

  const links: { to: string; label: string; show: boolean }[] = [
    { to: `${paths.customers}?new=1`, label: 'New customer', show: front },
    { to: `${paths.bikes}?new=1`, label: 'New bike', show: front },
    { to: paths.upload, label: 'Upload runs', show: workshop },
    { to: paths.runs, label: 'Runs', show: true },
    { to: paths.comparisons, label: 'Comparisons', show: true },
    { to: paths.finder, label: 'Build finder', show: true },
  ];

  return (
    <>
      <PageHeader title="Today" subtitle={`${today} · signed in as ${user.name}`} />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
        <div className="min-w-0 space-y-6">
          <Card title="Find a customer">
            <form
              role="search"
              className="flex flex-col gap-3 sm:flex-row sm:items-end"
              onSubmit={(e) => {
                e.preventDefault();
                navigate(`${paths.customers}${search.trim() ? `?q=${encodeURIComponent(search.trim())}` : ''}`);
              }}
            >
              <SearchInput label="Name, e-mail or phone" showLabel value={search} onValueChange={setSearch} containerClassName="flex-1" placeholder="e.g. a surname or the last digits of a phone number" />
              <Button type="submit">Search</Button>
            </form>
          </Card>
          <nav aria-label="Quick links">
            <ul className="grid grid-cols-2 gap-3 md:grid-cols-3">
              {links
                .filter((l) => l.show)
                .map((l) => (
                  <li key={l.label}>
                    <Link
                      to={l.to}
                      className="focus-ring flex min-h-14 items-center justify-between gap-2 rounded-card border border-line bg-paper-raised px-4 font-semibold text-ink shadow-card hover:border-accent hover:text-accent"
                    >
                      {l.label}
                      <Icon name="chevron-right" size={18} />
                    </Link>
                  </li>
                ))}
            </ul>
          </nav>
          <div className="grid gap-6 md:grid-cols-2">
            <RecentCard
              title="Newest customers"
              allLink={paths.customers}
              query={customers}
              empty="No customers yet."
              render={(c) => (
                <Link to={paths.customer(c.id)} className="focus-ring flex items-baseline justify-between gap-3 px-4 py-3 hover:bg-paper-sunk">
                  <span className="truncate font-semibold text-accent">{c.name}</span>
                  <span className="num shrink-0 text-sm text-ink-subtle">{formatDate(c.createdAt)}</span>
                </Link>
              )}
            />
            <RecentCard
              title="Newest bikes"
              allLink={paths.bikes}
              query={bikes}
              empty="No bikes yet."
              render={(b) => (
                <Link to={paths.bike(b.id)} className="focus-ring flex flex-col px-4 py-3 hover:bg-paper-sunk">
                  <span className="truncate font-semibold text-accent">{bikeTitle(b)}</span>
                  <span className="truncate text-sm text-ink-muted">{b.customerName}</span>
                </Link>
              )}
            />
          </div>
        </div>
        <aside className="min-w-0 space-y-4" aria-label="Cautions">
          <DynoCaution />
          <EngineCaution />
        </aside>
      </div>
    </>
  );
}

function RecentCard<T extends { id: string }>({ title, allLink, query, empty, render }: { title: string; allLink: string; query: UseQueryResult<Page<T>>; empty: string; render: (item: T) => ReactNode }) {
  return (
    <Card
      title={title}
      flush
      actions={
        <Link to={allLink} className="focus-ring rounded-control text-sm text-accent underline">
          See all
        </Link>
      }
    >
      {query.isPending ? (
        <LoadingState compact />
      ) : query.isError ? (
        <ErrorState error={query.error} onRetry={() => query.refetch()} isRetrying={query.isFetching} className="py-6" />
      ) : query.data.items.length === 0 ? (
        <EmptyState title={empty} className="py-6" />
      ) : (
        <ul className="divide-y divide-line">
          {query.data.items.map((item) => (
            <li key={item.id}>{render(item)}</li>
          ))}
        </ul>
      )}
    </Card>
  );
}
