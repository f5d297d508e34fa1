import type { ReactNode } from 'react';
import { cn } from './cn';
import { Icon } from './Icon';

export interface FormErrorProps {
  /** The message; nothing renders when it is empty. Accepts an Error or API error with `message`. */
  error?: ReactNode | Error | { message?: string } | null;
  /** Heading above the message; default "That didn't save". */
  title?: ReactNode;
  className?: string;
}

function toMessage(error: FormErrorProps['error']): ReactNode {
  if (error instanceof Error) return error.message;
  if (error && typeof error === 'object' && !('$$typeof' in error) && 'message' in error) {
    return (error as { message?: string }).message;
  }
  return error as ReactNode;
}

/** A form-level error (e.g. the server refused the save), announced as soon as it appears. */
export function FormError({ error, title = "That didn't save", className }: FormErrorProps) {
  const message = toMessage(error);
  if (message === null || message === undefined || message === false || message === '') return null;
  return (
    <div role="alert" className={cn('flex gap-3 rounded-card border border-loss/40 bg-loss-soft p-3 text-loss', className)}>
      <Icon name="octagon" className="mt-0.5" />
      <div>
        <p className="font-semibold">{title}</p>
        <div className="text-ink">{message}</div>
      </div>
    </div>
  );
}
