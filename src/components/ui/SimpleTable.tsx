import { useId, type ReactNode } from 'react';
import { cn } from './cn';

/** A header cell: its text, or the text and whether the column holds numbers (right-aligned). */
export type SimpleColumn = ReactNode | { label: ReactNode; numeric?: boolean; className?: string };

export interface SimpleTableProps {
  columns: readonly SimpleColumn[];
  /**
   * Accessible name, read by screen readers only. It also names the scroll box, which is a
   * focusable region so keyboard users can scroll a wide or tall table.
   */
  caption: ReactNode;
  /** The scroll box around the table, e.g. "overflow-x-auto". */
  className?: string;
  /** Minimum width of the table before the box scrolls, e.g. "min-w-[32rem]". */
  minWidth: string;
  /** Cell padding of the header: px-3 (default) or px-4. */
  pad?: 'px-3' | 'px-4';
  /** Keep the header on top while the box scrolls. */
  stickyHead?: boolean;
  /** Class of the body; default "num" (tabular figures). */
  bodyClassName?: string;
  /** The rows. */
  children: ReactNode;
}

function isColumnSpec(c: SimpleColumn): c is { label: ReactNode; numeric?: boolean; className?: string } {
  return typeof c === 'object' && c !== null && 'label' in c;
}

/** A small static table (figures, a short list) with the kit's header look; DataTable is for sorting and paging. */
export function SimpleTable({ columns, caption, className, minWidth, pad = 'px-3', stickyHead, bodyClassName = 'num', children }: SimpleTableProps) {
  const captionId = useId();
  return (
    <div className={className} role="region" aria-labelledby={captionId} tabIndex={0}>
      <table className={cn('w-full text-sm', minWidth)}>
        <caption id={captionId} className="sr-only">
          {caption}
        </caption>
        <thead className={cn(stickyHead && 'sticky top-0', 'bg-paper-sunk text-left text-ink-muted')}>
          <tr>
            {columns.map((c, i) => {
              const spec = isColumnSpec(c) ? c : { label: c };
              return (
                <th key={i} scope="col" className={cn(spec.className, pad, 'py-2', spec.numeric && 'text-right', 'font-medium')}>
                  {spec.label}
                </th>
              );
            })}
          </tr>
        </thead>
        <tbody className={bodyClassName}>{children}</tbody>
      </table>
    </div>
  );
}
