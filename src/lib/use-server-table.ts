import { useMemo, useState } from 'react';
import { useQuery, type QueryKey, type UseQueryOptions } from '@tanstack/react-query';
import { useSearchParams } from 'react-router-dom';
import type { OnChangeFn, PaginationState, SortingState } from '@tanstack/react-table';
import type { Page } from '@shared/schemas/common';
import { useDebouncedValue } from '@/components/ui/useDebouncedValue';

/** The list filters every server-sorted, server-paged table sends: `sort` is "field" or "-field". */
export interface ServerTableFilters {
  q?: string;
  sort?: string;
  page: number;
  pageSize: number;
}

const toSort = (s: SortingState) => (s[0] ? `${s[0].desc ? '-' : ''}${s[0].id}` : undefined);

/**
 * Search box, sorting and paging of a table the server sorts and pages, wired to its list query.
 * The search starts from the URL's `q`; a new search or sort goes back to the first page.
 */
export function useServerTable<TItem, TKey extends QueryKey>(options: {
  defaultSort: SortingState;
  query: (filters: ServerTableFilters) => UseQueryOptions<Page<TItem>, Error, Page<TItem>, TKey>;
}) {
  const [params] = useSearchParams();
  const [search, setSearch] = useState(params.get('q') ?? '');
  const q = useDebouncedValue(search.trim(), 300);
  const [sorting, setSorting] = useState<SortingState>(options.defaultSort);
  const [pagination, setPagination] = useState<PaginationState>({ pageIndex: 0, pageSize: 25 });

  const filters = useMemo(() => ({ q: q || undefined, sort: toSort(sorting), page: pagination.pageIndex + 1, pageSize: pagination.pageSize }), [q, sorting, pagination]);
  const list = useQuery(options.query(filters));

  const firstPage = () => setPagination((p) => ({ ...p, pageIndex: 0 }));
  const onSearchChange = (v: string) => {
    setSearch(v);
    firstPage();
  };
  const onSortingChange: OnChangeFn<SortingState> = (updater) => {
    setSorting(updater);
    firstPage();
  };

  return {
    search,
    onSearchChange,
    /** The debounced, trimmed search the list was asked for. */
    q,
    list,
    /** Spread into DataTable: the current page's rows, loading state and server-side sorting and paging. */
    tableProps: {
      data: list.data?.items ?? [],
      isLoading: list.isFetching,
      totalRows: list.data?.total,
      totalIsEstimate: list.data?.totalIsEstimate,
      sorting,
      onSortingChange,
      pagination,
      onPaginationChange: setPagination,
    },
  };
}
