import { useEffect, useId, useRef, useState, type ReactNode, type RefObject } from 'react';
import {
  flexRender,
  getCoreRowModel,
  useReactTable,
  type ColumnDef,
  type Header,
  type OnChangeFn,
  type PaginationState,
  type RowData,
  type SortingState,
  type Table,
} from '@tanstack/react-table';
import { cn } from './cn';
import { Icon } from './Icon';
import { LoadingState } from './LoadingState';
import { Pagination } from './Pagination';

declare module '@tanstack/react-table' {
  // Type parameters must match the library's declaration to merge.
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  interface ColumnMeta<TData extends RowData, TValue> {
    /** Cell and header alignment; numbers should be "right". */
    align?: 'left' | 'center' | 'right';
    /** Right-aligned tabular figures (sets align "right"). */
    numeric?: boolean;
    /** Let long text wrap instead of scrolling sideways. */
    wrap?: boolean;
    headerClassName?: string;
    cellClassName?: string;
    /**
     * How much the column matters on a narrow screen. "key": always shown, and the first key
     * column stays put while the table scrolls sideways. "extra": left out below 1024 px (a
     * tablet) until the reader asks for every column. Default: always shown.
     */
    priority?: 'key' | 'extra';
  }
}

interface DataTableCommonProps {
  /** Accessible name of the table (its <caption>); shown only when `showCaption`. */
  caption: string;
  showCaption?: boolean;
  /** First load (no rows yet): shows a loading row; with rows, dims them while refetching. */
  isLoading?: boolean;
  /** Shown in the body when there are no rows. */
  emptyMessage?: ReactNode;
  /** Scroll box height, so the header can stick; default "70vh". null lets the page scroll. */
  maxHeight?: string | null;
  /** Show the pagination bar; default: when pagination is managed. */
  showPagination?: boolean;
  pageSizeOptions?: readonly number[];
  /** Total rows on the server, for "21–40 of 312". */
  totalRows?: number;
  /** `totalRows` is an estimate: "21–40 of about 24,800". */
  totalIsEstimate?: boolean;
  className?: string;
}

export interface DataTableInstanceProps<TData> extends DataTableCommonProps {
  /** A table you built with useReactTable (for anything the simple props don't cover). */
  table: Table<TData>;
}

export interface DataTableConfigProps<TData> extends DataTableCommonProps {
  // ColumnDef's value type differs per column; `any` is how TanStack types a mixed list.
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  columns: ColumnDef<TData, any>[];
  data: TData[];
  /** Server-side sorting: pass both, and fetch with the sorting state. Without them, no sorting. */
  sorting?: SortingState;
  onSortingChange?: OnChangeFn<SortingState>;
  /** Server-side pagination: pass pagination + onPaginationChange and pageCount (or totalRows). */
  pagination?: PaginationState;
  onPaginationChange?: OnChangeFn<PaginationState>;
  pageCount?: number;
  getRowId?: (row: TData, index: number) => string;
}

export type DataTableProps<TData> = DataTableInstanceProps<TData> | DataTableConfigProps<TData>;

/**
 * A dense, calm table on TanStack Table v8, built for server-side sorting and paging.
 * Pass either a ready `table` instance or `columns` + `data` (+ sorting/pagination state).
 */
export function DataTable<TData>(props: DataTableProps<TData>) {
  if ('table' in props) return <DataTableView {...props} />;
  return <ConfiguredDataTable {...props} />;
}

function ConfiguredDataTable<TData>({
  columns,
  data,
  sorting,
  onSortingChange,
  pagination,
  onPaginationChange,
  pageCount,
  getRowId,
  totalRows,
  showPagination,
  ...common
}: DataTableConfigProps<TData>) {
  const paged = pagination !== undefined && onPaginationChange !== undefined;
  const table = useReactTable<TData>({
    columns,
    data,
    getRowId,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    enableSorting: onSortingChange !== undefined,
    enableMultiSort: false,
    onSortingChange,
    onPaginationChange,
    pageCount: pageCount ?? (paged && totalRows !== undefined ? Math.ceil(totalRows / pagination.pageSize) : undefined),
    rowCount: totalRows,
    state: {
      ...(sorting ? { sorting } : {}),
      ...(pagination ? { pagination } : {}),
    },
  });
  return <DataTableView table={table} totalRows={totalRows} showPagination={showPagination ?? paged} {...common} />;
}

function ariaSort(header: Header<unknown, unknown>): 'ascending' | 'descending' | 'none' | undefined {
  if (!header.column.getCanSort()) return undefined;
  const dir = header.column.getIsSorted();
  return dir === 'asc' ? 'ascending' : dir === 'desc' ? 'descending' : 'none';
}

const alignClass = { left: 'text-left', center: 'text-center', right: 'text-right' } as const;

/** Classes a column's priority adds to its header and cells: extras hide below lg, the first key column sticks to the left. */
export function priorityClass(priority: 'key' | 'extra' | undefined, opts: { showExtras: boolean; sticky: boolean; header: boolean }): string {
  const parts: string[] = [];
  if (priority === 'extra' && !opts.showExtras) parts.push('max-lg:hidden');
  if (priority === 'key' && opts.sticky) parts.push('sticky left-0', opts.header ? 'z-20 bg-paper-sunk' : 'z-[5] bg-paper-raised', 'border-r border-line');
  return parts.join(' ');
}

/**
 * Whether the box scrolls sideways and whether more lies to the right, kept current on resize and
 * scroll, so the table can say so in words (a sideways scroll has no scroll bar on a tablet).
 */
function useSidewaysScroll(ref: RefObject<HTMLDivElement | null>) {
  const [state, setState] = useState({ scrolls: false, moreRight: false });
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const update = () => {
      const scrolls = el.scrollWidth > el.clientWidth + 1;
      const moreRight = scrolls && el.scrollLeft + el.clientWidth < el.scrollWidth - 1;
      setState((s) => (s.scrolls === scrolls && s.moreRight === moreRight ? s : { scrolls, moreRight }));
    };
    update();
    el.addEventListener('scroll', update, { passive: true });
    const observer = typeof ResizeObserver === 'undefined' ? null : new ResizeObserver(update);
    observer?.observe(el);
    if (el.firstElementChild) observer?.observe(el.firstElementChild);
    return () => {
      el.removeEventListener('scroll', update);
      observer?.disconnect();
    };
  }, [ref]);
  return state;
}

function DataTableView<TData>({
  table,
  caption,
  showCaption = false,
  isLoading = false,
  emptyMessage = 'Nothing to show.',
  maxHeight = '70vh',
  showPagination,
  pageSizeOptions,
  totalRows,
  totalIsEstimate,
  className,
}: DataTableInstanceProps<TData>) {
  const rows = table.getRowModel().rows;
  const columnCount = table.getVisibleLeafColumns().length || 1;
  const { pagination } = table.getState();
  const paged = showPagination ?? Boolean(table.options.manualPagination || table.options.getPaginationRowModel);
  const scrollRef = useRef<HTMLDivElement>(null);
  const { scrolls, moreRight } = useSidewaysScroll(scrollRef);
  const [showExtras, setShowExtras] = useState(false);
  const leafColumns = table.getVisibleLeafColumns();
  const extraCount = leafColumns.filter((c) => c.columnDef.meta?.priority === 'extra').length;
  const stickyId = leafColumns.find((c) => c.columnDef.meta?.priority === 'key')?.id;
  const hintId = `${useId()}-hint`;

  return (
    <div className={cn('rounded-card border border-line bg-paper-raised', className)}>
      {(extraCount > 0 || scrolls) && (
        <div className="flex flex-wrap items-center justify-between gap-2 border-b border-line px-3 py-1 text-sm text-ink-muted" data-testid="table-hint">
          <span id={hintId}>
            {scrolls ? (moreRight ? 'More columns to the right: swipe or scroll sideways →' : 'Scroll sideways to see every column ←') : ''}
          </span>
          {extraCount > 0 && (
            <button type="button" onClick={() => setShowExtras((v) => !v)} aria-pressed={showExtras} className="focus-ring min-h-11 rounded-control px-2 font-semibold text-accent hover:underline lg:hidden">
              {showExtras ? 'Fewer columns' : `All columns (${extraCount} more)`}
            </button>
          )}
        </div>
      )}
      {/* Focusable so keyboard users can scroll a wide table sideways. */}
      <div
        ref={scrollRef}
        role="region"
        aria-label={caption}
        aria-describedby={scrolls ? hintId : undefined}
        tabIndex={0}
        className={cn('relative overflow-auto overscroll-x-contain rounded-card', moreRight && 'shadow-[inset_-12px_0_10px_-10px_rgb(30_28_25/0.25)]')}
        style={maxHeight ? { maxHeight } : undefined}
      >
        <table className="min-w-full border-separate border-spacing-0 text-left text-sm" aria-busy={isLoading || undefined}>
          <caption className={cn(showCaption ? 'px-4 py-3 text-left text-base font-semibold text-ink' : 'sr-only')}>
            {caption}
          </caption>
          <thead>
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const meta = header.column.columnDef.meta;
                  const align = meta?.align ?? (meta?.numeric ? 'right' : 'left');
                  const sortable = header.column.getCanSort();
                  const sorted = header.column.getIsSorted();
                  const content = header.isPlaceholder ? null : flexRender(header.column.columnDef.header, header.getContext());
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      colSpan={header.colSpan}
                      aria-sort={ariaSort(header as Header<unknown, unknown>)}
                      style={header.column.columnDef.size !== 150 ? { width: header.getSize() } : undefined}
                      className={cn(
                        'sticky top-0 z-10 whitespace-nowrap border-b border-line-strong bg-paper-sunk px-3 py-2 font-semibold text-ink-muted',
                        alignClass[align],
                        priorityClass(meta?.priority, { showExtras, sticky: header.column.id === stickyId, header: true }),
                        meta?.headerClassName,
                      )}
                    >
                      {sortable && content !== null ? (
                        <button
                          type="button"
                          onClick={header.column.getToggleSortingHandler()}
                          className={cn(
                            '-mx-2 inline-flex min-h-11 items-center gap-1 rounded-control px-2 font-semibold hover:bg-line hover:text-ink',
                            align === 'right' && 'flex-row-reverse',
                            sorted && 'text-ink',
                          )}
                        >
                          <span>{content}</span>
                          <Icon
                            name={sorted === 'asc' ? 'arrow-up' : sorted === 'desc' ? 'arrow-down' : 'sort-none'}
                            size={16}
                            className={sorted ? 'text-accent' : 'text-ink-subtle'}
                          />
                        </button>
                      ) : (
                        content
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody className={cn(isLoading && rows.length > 0 && 'opacity-60 transition-opacity')}>
            {rows.length === 0 ? (
              <tr>
                <td colSpan={columnCount} className="px-3">
                  {isLoading ? (
                    <LoadingState compact />
                  ) : (
                    <div className="py-10 text-center text-base text-ink-muted">{emptyMessage}</div>
                  )}
                </td>
              </tr>
            ) : (
              rows.map((row) => (
                <tr
                  key={row.id}
                  data-selected={row.getIsSelected() || undefined}
                  className="hover:bg-paper-sunk/60 data-selected:bg-accent-soft"
                >
                  {row.getVisibleCells().map((cell) => {
                    const meta = cell.column.columnDef.meta;
                    const align = meta?.align ?? (meta?.numeric ? 'right' : 'left');
                    return (
                      <td
                        key={cell.id}
                        className={cn(
                          'border-b border-line px-3 py-2 align-middle text-ink',
                          alignClass[align],
                          meta?.numeric && 'num',
                          meta?.wrap ? 'min-w-48' : 'whitespace-nowrap',
                          priorityClass(meta?.priority, { showExtras, sticky: cell.column.id === stickyId, header: false }),
                          meta?.cellClassName,
                        )}
                      >
                        {flexRender(cell.column.columnDef.cell, cell.getContext())}
                      </td>
                    );
                  })}
                </tr>
              ))
            )}
          </tbody>
        </table>
      </div>
      {paged && (
        <div className="border-t border-line px-3">
          <Pagination
            pageIndex={pagination.pageIndex}
            pageCount={table.getPageCount()}
            onPageChange={(index) => table.setPageIndex(index)}
            pageSize={pagination.pageSize}
            pageSizeOptions={pageSizeOptions}
            onPageSizeChange={(size) => table.setPagination({ pageIndex: 0, pageSize: size })}
            totalRows={totalRows ?? (table.options.rowCount !== undefined ? table.getRowCount() : undefined)}
            totalIsEstimate={totalIsEstimate}
            disabled={isLoading && rows.length === 0}
          />
        </div>
      )}
    </div>
  );
}
