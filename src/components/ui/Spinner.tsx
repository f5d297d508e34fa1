import { cn } from './cn';

export interface SpinnerProps {
  /** Pixel size; default 20. */
  size?: number;
  /**
   * Text for screen readers. When set, the spinner announces itself as a status;
   * leave it out when the surrounding text already says what is happening.
   */
  label?: string;
  className?: string;
}

/** A rotating ring in the current text colour. */
export function Spinner({ size = 20, label, className }: SpinnerProps) {
  const ring = (
    <svg
      viewBox="0 0 24 24"
      width={size}
      height={size}
      className={cn('shrink-0 animate-spin', className)}
      aria-hidden="true"
      focusable="false"
    >
      <circle cx="12" cy="12" r="9" fill="none" stroke="currentColor" strokeOpacity="0.25" strokeWidth="3" />
      <path d="M21 12a9 9 0 0 0-9-9" fill="none" stroke="currentColor" strokeWidth="3" strokeLinecap="round" />
    </svg>
  );
  if (!label) return ring;
  return (
    <span role="status" className="inline-flex items-center">
      {ring}
      <span className="sr-only">{label}</span>
    </span>
  );
}
