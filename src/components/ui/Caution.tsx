import type { ReactNode } from 'react';
import { cn } from './cn';
import { Icon } from './Icon';

export interface CautionProps {
  /** Heading; default "Caution". */
  title?: ReactNode;
  /** Heading level, so the callout fits the page outline; default 3. */
  level?: 2 | 3 | 4;
  /** `caution` for safety (amber, triangle); `notice` for report caveats (neutral, info ring). */
  kind?: 'caution' | 'notice';
  children: ReactNode;
  className?: string;
}

/**
 * A callout for safety cautions and report caveats — e.g. dyno operation checks before a pull,
 * or "compare only like with like" on a gain report. Short, specific, where it matters.
 */
export function Caution({ title = 'Caution', level = 3, kind = 'caution', children, className }: CautionProps) {
  const Heading = `h${level}` as const;
  const isCaution = kind === 'caution';
  return (
    <div
      role="note"
      className={cn(
        'flex gap-3 rounded-card border-l-4 p-4',
        isCaution ? 'border-warn bg-warn-soft' : 'border-info bg-info-soft',
        className,
      )}
    >
      <Icon name={isCaution ? 'triangle' : 'circle-info'} size={22} className={cn('mt-0.5', isCaution ? 'text-warn' : 'text-info')} />
      <div className="min-w-0 text-ink">
        <Heading className={cn('font-semibold', isCaution ? 'text-warn' : 'text-info')}>{title}</Heading>
        <div className="mt-1 space-y-1 text-base leading-snug [&_ul]:list-disc [&_ul]:pl-5">{children}</div>
      </div>
    </div>
  );
}
