import type { ReactNode } from 'react';
import { cn } from './cn';

export interface PageHeaderProps {
  /** The page's one h1. */
  title: ReactNode;
  subtitle?: ReactNode;
  /** The page's primary action (one per page), e.g. a primary Button. */
  action?: ReactNode;
  /** Less important actions, shown before the primary one. */
  secondaryActions?: ReactNode;
  /** Breadcrumb or back link above the title. */
  back?: ReactNode;
  /** Extra content under the title, e.g. status badges. */
  meta?: ReactNode;
  className?: string;
}

/** Title, subtitle and the page's primary action. */
export function PageHeader({ title, subtitle, action, secondaryActions, back, meta, className }: PageHeaderProps) {
  return (
    <header className={cn('mb-6 flex flex-col gap-3 md:flex-row md:items-end md:justify-between', className)}>
      <div className="min-w-0">
        {back != null && <div className="mb-1 text-sm">{back}</div>}
        <h1 className="text-2xl font-bold leading-tight text-ink md:text-3xl">{title}</h1>
        {subtitle != null && <p className="mt-1 text-base text-ink-muted">{subtitle}</p>}
        {meta != null && <div className="mt-2 flex flex-wrap items-center gap-2">{meta}</div>}
      </div>
      {(action != null || secondaryActions != null) && (
        <div className="flex shrink-0 flex-wrap items-center gap-2">
          {secondaryActions}
          {action}
        </div>
      )}
    </header>
  );
}
