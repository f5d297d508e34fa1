import { usePageTitle } from './page-title';
import type { ReactNode } from 'react';
import { useSearchParams } from 'react-router-dom';
import type { QueryKey, UseQueryOptions } from '@tanstack/react-query';
import type { ColumnDef, SortingState } from '@tanstack/react-table';
import type { Page } from '@shared/schemas/common';
import { formatNumber } from '@shared/format';
import { Button, DataTable, ErrorState, Icon, PageHeader, SearchInput } from '@/components/ui';
import { useServerTable, type ServerTableFilters } from './use-server-table';

/**
 * `?new=1` in the URL opens a list page's "New …" dialog (so Today's quick links can open it);
 * closing it also drops the other parameters the dialog was preset with.
 */
export function useNewDialogParam(presetParams: readonly string[] = []): [boolean, (open: boolean) => void] {
  const [params, setParams] = useSearchParams();
  const setOpen = (open: boolean) =>
    setParams(
      (p) => {
        if (open) p.set('new', '1');
        else for (const name of ['new', ...presetParams]) p.delete(name);
        return p;
      },
      { replace: true },
    );
  return [params.get('new') === '1', setOpen];
}

export interface ServerListPageProps<TItem, TKey extends QueryKey> {
  title: string;
  /** The item's name, one and many ("bike", "bikes"), for "12 bikes matching “x”". */
  noun: readonly [string, string];
  /** After the count when nothing is searched, e.g. " on file". */
  unfilteredSuffix?: string;
  /** Before the list has loaded. */
  idleSubtitle: string;
  /** The "New …" button; none when the caller may not create. */
  newButton?: { label: string; onClick: () => void };
  searchLabel: string;
  searchPlaceholder: string;
  // ColumnDef's value type differs per column; `any` is how TanStack types a mixed list.
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  columns: ColumnDef<TItem, any>[];
  getRowId: (item: TItem) => string;
  /** What the table says when empty, given the current search. */
  emptyMessage: (q: string) => ReactNode;
  defaultSort: SortingState;
  query: (filters: ServerTableFilters) => UseQueryOptions<Page<TItem>, Error, Page<TItem>, TKey>;
  /** Dialogs and anything else below the table. */
  children?: ReactNode;
}

/**
 * A searchable, server-sorted and server-paged list page (customers, bikes): header with the
 * count and the "New …" button, search box, the table or its error, then the caller's dialogs.
 */
export function ServerListPage<TItem, TKey extends QueryKey>(props: ServerListPageProps<TItem, TKey>) {
  usePageTitle(props.title);
  const { search, onSearchChange, q, list, tableProps } = useServerTable({ defaultSort: props.defaultSort, query: props.query });
  const total = list.data?.total;
  const [one, many] = props.noun;
  return (
    <>
      <PageHeader
        title={props.title}
        subtitle={total !== undefined ? `${list.data?.totalIsEstimate ? 'About ' : ''}${formatNumber(total)} ${total === 1 ? one : many}${q ? ` matching “${q}”` : (props.unfilteredSuffix ?? '')}` : props.idleSubtitle}
        action={
          props.newButton && (
            <Button variant="primary" icon={<Icon name="plus" size={18} />} onClick={props.newButton.onClick}>
              {props.newButton.label}
            </Button>
          )
        }
      />
      <SearchInput label={props.searchLabel} placeholder={props.searchPlaceholder} value={search} onValueChange={onSearchChange} containerClassName="mb-4 max-w-md" />
      {list.isError && !list.data ? (
        <ErrorState error={list.error} onRetry={() => list.refetch()} isRetrying={list.isFetching} />
      ) : (
        <DataTable caption={props.title} columns={props.columns} getRowId={props.getRowId} {...tableProps} maxHeight={null} emptyMessage={props.emptyMessage(q)} />
      )}
      {props.children}
    </>
  );
}
