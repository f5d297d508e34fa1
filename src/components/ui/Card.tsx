import type { ComponentProps, ReactNode } from 'react';
import { useId } from 'react';
import { cn } from './cn';

export interface CardProps extends Omit<ComponentProps<'section'>, 'title'> {
  /** Heading; when set the card is a labelled region. */
  title?: ReactNode;
  /** Heading level for the title; default 2. */
  level?: 2 | 3 | 4;
  /** Line under the title. */
  description?: ReactNode;
  /** Buttons or links at the header's end. */
  actions?: ReactNode;
  /** Footer row, e.g. form buttons. */
  footer?: ReactNode;
  /** Remove body padding (for a table that runs edge to edge). */
  flush?: boolean;
}

/** A raised surface grouping related content. */
export function Card({ title, level = 2, description, actions, footer, flush = false, className, children, ...rest }: CardProps) {
  const headingId = useId();
  const Heading = `h${level}` as const;
  const hasHeader = title != null || actions != null;
  return (
    <section
      aria-labelledby={title != null ? headingId : undefined}
      className={cn('rounded-card border border-line bg-paper-raised shadow-card', className)}
      {...rest}
    >
      {hasHeader && (
        <header className="flex flex-wrap items-start justify-between gap-3 border-b border-line px-4 py-3 md:px-5">
          <div className="min-w-0">
            {title != null && (
              <Heading id={headingId} className="text-lg font-semibold text-ink">
                {title}
              </Heading>
            )}
            {description != null && <p className="mt-0.5 text-sm text-ink-muted">{description}</p>}
          </div>
          {actions != null && <div className="flex shrink-0 flex-wrap items-center gap-2">{actions}</div>}
        </header>
      )}
      <div className={cn(!flush && 'p-4 md:p-5')}>{children}</div>
      {footer != null && (
        <footer className="flex flex-wrap items-center justify-end gap-2 border-t border-line px-4 py-3 md:px-5">{footer}</footer>
      )}
    </section>
  );
}
