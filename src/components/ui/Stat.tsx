import type { ReactNode } from 'react';
import { cn } from './cn';
import { Icon } from './Icon';
import { formatNumber, MISSING } from '@shared/format';

export interface StatDelta {
  /** Signed change, e.g. 6.1 for +6.1 hp. */
  value: number;
  /** Unit of the change; defaults to the stat's unit. */
  unit?: string;
  decimals?: number;
  /** Words after the change, e.g. "vs baseline". */
  label?: ReactNode;
  /** Is a rise good? Default true (more power); set false for e.g. a temperature. */
  higherIsBetter?: boolean;
}

export interface StatProps {
  label: ReactNode;
  /** The number (formatted with `decimals`), or ready text. null/undefined shows a dash. */
  value: number | string | null | undefined;
  unit?: string;
  /** Decimals for a numeric value; default 1. */
  decimals?: number;
  delta?: StatDelta;
  /** Small print under the value, e.g. "at 5,200 rpm". */
  detail?: ReactNode;
  size?: 'md' | 'lg';
  className?: string;
}

/** A big, scannable number with its label and unit, and an optional signed change. */
export function Stat({ label, value, unit, decimals = 1, delta, detail, size = 'md', className }: StatProps) {
  const text = typeof value === 'number' ? formatNumber(value, { decimals }) : (value ?? MISSING);
  const missing = text === MISSING;
  return (
    <div className={cn('min-w-0', className)}>
      <div className="text-sm font-medium text-ink-muted">{label}</div>
      <div className="mt-0.5 flex flex-wrap items-baseline gap-x-1.5">
        <span className={cn('num font-semibold text-ink', size === 'lg' ? 'text-stat-lg' : 'text-stat')}>{text}</span>
        {unit && !missing && <span className="text-lg font-medium text-ink-muted">{unit}</span>}
      </div>
      {delta && <StatDeltaLine delta={delta} unit={unit} />}
      {detail != null && <div className="num mt-0.5 text-sm text-ink-subtle">{detail}</div>}
    </div>
  );
}

function StatDeltaLine({ delta, unit }: { delta: StatDelta; unit?: string }) {
  const { value, decimals = 1, label, higherIsBetter = true } = delta;
  const shown = formatNumber(value, { decimals, signed: true });
  const rounded = Number(value.toFixed(decimals));
  const direction = rounded > 0 ? 'up' : rounded < 0 ? 'down' : 'flat';
  const good = direction === 'flat' ? null : (direction === 'up') === higherIsBetter;
  const deltaUnit = delta.unit ?? unit;
  return (
    <div
      className={cn(
        'mt-1 flex items-center gap-1 text-base font-semibold',
        good === true && 'text-gain',
        good === false && 'text-loss',
        good === null && 'text-ink-muted',
      )}
    >
      <Icon name={direction === 'up' ? 'arrow-up' : direction === 'down' ? 'arrow-down' : 'minus'} size={18} />
      <span className="num">
        {shown}
        {deltaUnit ? ` ${deltaUnit}` : ''}
      </span>
      {label != null && <span className="font-normal text-ink-muted">{label}</span>}
    </div>
  );
}
