import type { ReactNode } from 'react';
import { Button } from './Button';
import { cn } from './cn';
import { Icon } from './Icon';

export interface ErrorStateProps {
  /** Headline; default "This didn't load". */
  title?: ReactNode;
  /** Explanation. When omitted, the message of `error` is used. */
  message?: ReactNode;
  /** The caught error (an Error or API error with `message`). */
  error?: unknown;
  /** Shows a retry button when given. */
  onRetry?: () => void;
  retryLabel?: string;
  /** Spinner on the retry button while the refetch runs. */
  isRetrying?: boolean;
  className?: string;
}

function messageOf(error: unknown): string | undefined {
  if (error instanceof Error) return error.message;
  if (error && typeof error === 'object' && 'message' in error && typeof error.message === 'string') return error.message;
  return undefined;
}

/** A refusal (HTTP 403, e.g. a customer on a staff screen): asking again gets the same answer. */
function isRefusal(error: unknown): boolean {
  return Boolean(error && typeof error === 'object' && 'status' in error && error.status === 403);
}

/** A failed load: what went wrong and a way to try again (none for a refusal, which a retry cannot change). */
export function ErrorState({
  title = "This didn't load",
  message,
  error,
  onRetry,
  retryLabel = 'Try again',
  isRetrying = false,
  className,
}: ErrorStateProps) {
  const text = message ?? messageOf(error) ?? 'Something went wrong on the way. Check the connection and try again.';
  return (
    <div role="alert" className={cn('flex flex-col items-center px-4 py-12 text-center', className)}>
      <Icon name="octagon" size={36} strokeWidth={1.5} className="mb-3 text-loss" />
      <p className="text-lg font-semibold text-ink">{title}</p>
      <p className="mt-1 max-w-md text-ink-muted">{text}</p>
      {onRetry && !isRefusal(error) && (
        <Button className="mt-4" onClick={onRetry} loading={isRetrying} icon={<Icon name="refresh" size={18} />}>
          {retryLabel}
        </Button>
      )}
    </div>
  );
}
