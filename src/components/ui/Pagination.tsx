import { useId } from 'react';
import { cn } from './cn';
import { Icon } from './Icon';
import { IconButton } from './IconButton';
import { formatNumber } from '@shared/format';

export interface PaginationProps {
  /** Current page, 0-based (as TanStack Table counts). */
  pageIndex: number;
  /** Number of pages; 0 when there are no rows. */
  pageCount: number;
  onPageChange: (pageIndex: number) => void;
  /** Rows per page; with `onPageSizeChange`, shows a rows-per-page picker. */
  pageSize?: number;
  pageSizeOptions?: readonly number[];
  onPageSizeChange?: (pageSize: number) => void;
  /** Total rows across all pages; shows "21–40 of 312". */
  totalRows?: number;
  /** The total is the database's estimate (a large archive): says "about", and offers no "Last page". */
  totalIsEstimate?: boolean;
  /** Name of the navigation landmark; default "Pages". */
  label?: string;
  disabled?: boolean;
  className?: string;
}

/** First / previous / next / last, "Page 3 of 12", and an optional rows-per-page picker. */
export function Pagination({
  pageIndex,
  pageCount,
  onPageChange,
  pageSize,
  pageSizeOptions = [25, 50, 100],
  onPageSizeChange,
  totalRows,
  totalIsEstimate = false,
  label = 'Pages',
  disabled = false,
  className,
}: PaginationProps) {
  const sizeId = useId();
  const lastIndex = Math.max(pageCount - 1, 0);
  const current = Math.min(Math.max(pageIndex, 0), lastIndex);
  const atStart = disabled || current <= 0;
  const atEnd = disabled || current >= lastIndex;
  const about = totalIsEstimate ? 'about ' : '';
  const go = (index: number) => onPageChange(Math.min(Math.max(index, 0), lastIndex));

  const range =
    totalRows !== undefined && pageSize
      ? totalRows === 0
        ? 'No rows'
        : `${formatNumber(current * pageSize + 1)}–${formatNumber(Math.min((current + 1) * pageSize, totalRows))} of ${about}${formatNumber(totalRows)}`
      : null;

  return (
    <nav aria-label={label} className={cn('flex flex-wrap items-center justify-between gap-3 py-2', className)}>
      <div className="num text-sm text-ink-muted" aria-live="polite">
        {range}
      </div>
      <div className="flex flex-wrap items-center gap-3">
        {onPageSizeChange && pageSize !== undefined && (
          <div className="flex items-center gap-2 text-sm">
            <label htmlFor={sizeId} className="text-ink-muted">
              Rows per page
            </label>
            <select
              id={sizeId}
              value={pageSize}
              disabled={disabled}
              onChange={(event) => onPageSizeChange(Number(event.target.value))}
              className="num min-h-11 rounded-control border border-line-strong bg-paper-raised px-2 text-ink"
            >
              {pageSizeOptions.map((size) => (
                <option key={size} value={size}>
                  {size}
                </option>
              ))}
            </select>
          </div>
        )}
        <div className="flex items-center gap-1">
          <IconButton label="First page" size="sm" icon={<Icon name="chevrons-left" />} disabled={atStart} onClick={() => go(0)} />
          <IconButton
            label="Previous page"
            size="sm"
            icon={<Icon name="chevron-left" />}
            disabled={atStart}
            onClick={() => go(current - 1)}
          />
          <span className="num min-w-24 px-2 text-center text-sm text-ink">
            {pageCount > 0 ? `Page ${formatNumber(current + 1)} of ${about}${formatNumber(pageCount)}` : 'Page 0 of 0'}
          </span>
          <IconButton label="Next page" size="sm" icon={<Icon name="chevron-right" />} disabled={atEnd} onClick={() => go(current + 1)} />
          {!totalIsEstimate && <IconButton label="Last page" size="sm" icon={<Icon name="chevrons-right" />} disabled={atEnd} onClick={() => go(lastIndex)} />}
        </div>
      </div>
    </nav>
  );
}
