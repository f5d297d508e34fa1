import type { ReactNode } from 'react';
import { cn } from './cn';
import { Icon, type IconName } from './Icon';

export interface EmptyStateProps {
  /** Short headline, e.g. "No runs yet". */
  title: ReactNode;
  /** What to do next, in plain words. */
  message?: ReactNode;
  /** Optional action, e.g. a Button to upload. */
  action?: ReactNode;
  icon?: IconName;
  className?: string;
  /** Make the title a heading of this level, for when the empty state is the whole page (level 1). */
  headingLevel?: 1 | 2 | 3;
}

/** Shown when a list or search has nothing to show; says why and what to do next. */
export function EmptyState({ title, message, action, icon = 'inbox', className, headingLevel }: EmptyStateProps) {
  const Title = headingLevel ? (`h${headingLevel}` as const) : 'p';
  return (
    <div className={cn('flex flex-col items-center px-4 py-12 text-center', className)}>
      <Icon name={icon} size={36} strokeWidth={1.5} className="mb-3 text-ink-subtle" />
      <Title className="text-lg font-semibold text-ink">{title}</Title>
      {message != null && <p className="mt-1 max-w-md text-ink-muted">{message}</p>}
      {action != null && <div className="mt-4">{action}</div>}
    </div>
  );
}
