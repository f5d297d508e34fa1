import type { ReactNode } from 'react';
import { cn } from './cn';
import { Spinner } from './Spinner';

export interface LoadingStateProps {
  /** What is loading, in plain words; default "Loading…". */
  message?: ReactNode;
  /** Smaller, inline version for a card or a table body. */
  compact?: boolean;
  className?: string;
}

/** A spinner with words, announced politely to screen readers. */
export function LoadingState({ message = 'Loading…', compact = false, className }: LoadingStateProps) {
  return (
    <div
      role="status"
      aria-live="polite"
      className={cn(
        'flex items-center justify-center gap-3 text-ink-muted',
        compact ? 'py-4 text-sm' : 'flex-col py-12 text-base',
        className,
      )}
    >
      <Spinner size={compact ? 18 : 28} className="text-accent" />
      <span>{message}</span>
    </div>
  );
}
