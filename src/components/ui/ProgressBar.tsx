import type { ReactNode } from 'react';
import { useId } from 'react';
import { cn } from './cn';
import { formatNumber } from '@shared/format';

export interface ProgressBarProps {
  /** Visible label, e.g. "Uploading 12 files". Also the bar's accessible name. */
  label: ReactNode;
  /** Current value; leave undefined for an indeterminate bar (no percentage is claimed). */
  value?: number;
  /** Default 100. */
  max?: number;
  /** Custom text beside the label instead of the percentage, e.g. "7 of 12 files". */
  valueText?: string;
  tone?: 'accent' | 'gain' | 'loss';
  className?: string;
}

const fillTone = { accent: 'bg-accent', gain: 'bg-gain', loss: 'bg-loss' } as const;

/** A determinate progress bar with its percentage in text. */
export function ProgressBar({ label, value, max = 100, valueText, tone = 'accent', className }: ProgressBarProps) {
  const labelId = useId();
  const determinate = typeof value === 'number' && Number.isFinite(value) && max > 0;
  const clamped = determinate ? Math.min(Math.max(value, 0), max) : 0;
  const percent = determinate ? (clamped / max) * 100 : 0;
  const text = determinate ? (valueText ?? `${formatNumber(Math.floor(percent))}%`) : valueText;
  return (
    <div className={cn('w-full', className)}>
      <div className="mb-1 flex items-baseline justify-between gap-3 text-sm">
        <span id={labelId} className="font-medium text-ink">
          {label}
        </span>
        {text && <span className="num text-ink-muted" aria-hidden="true">{text}</span>}
      </div>
      <div
        role="progressbar"
        aria-labelledby={labelId}
        aria-valuemin={determinate ? 0 : undefined}
        aria-valuemax={determinate ? max : undefined}
        aria-valuenow={determinate ? clamped : undefined}
        aria-valuetext={text}
        className="relative h-2.5 w-full overflow-hidden rounded-full bg-paper-sunk ring-1 ring-inset ring-line"
      >
        <div
          className={cn(
            'h-full rounded-full transition-[width] duration-200',
            fillTone[tone],
            !determinate && 'w-2/5 animate-indeterminate',
          )}
          style={determinate ? { width: `${percent}%` } : undefined}
        />
      </div>
    </div>
  );
}
