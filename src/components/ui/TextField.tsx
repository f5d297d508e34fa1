import type { ComponentProps, ReactNode } from 'react';
import { cn } from './cn';
import { FieldShell, useLabelledControl, type FieldBaseProps } from './Field';
import { controlClass } from './styles';

export interface TextFieldProps extends FieldBaseProps, Omit<ComponentProps<'input'>, 'children' | 'prefix'> {
  /** Text or icon inside the start of the input (e.g. "$"). */
  prefix?: ReactNode;
  /** Text inside the end of the input (e.g. a unit). */
  suffix?: ReactNode;
}

/**
 * A labelled text input. Spread `register('name')` straight in: the ref reaches the input
 * (React 19 passes `ref` as a prop).
 */
export function TextField({ prefix, suffix, className, type = 'text', ...props }: TextFieldProps) {
  const { shell, control } = useLabelledControl(props);
  return (
    <FieldShell {...shell}>
      <AffixWrapper prefix={prefix} suffix={suffix}>
        <input type={type} className={cn(controlClass, prefix != null && 'pl-9', suffix != null && 'pr-14', className)} {...control} />
      </AffixWrapper>
    </FieldShell>
  );
}

/** Positions optional prefix/suffix text over the input edges. */
export function AffixWrapper({ prefix, suffix, children }: { prefix?: ReactNode; suffix?: ReactNode; children: ReactNode }) {
  if (prefix == null && suffix == null) return <>{children}</>;
  return (
    <div className="relative">
      {prefix != null && (
        <span className="pointer-events-none absolute inset-y-0 left-3 flex items-center text-ink-subtle" aria-hidden="true">
          {prefix}
        </span>
      )}
      {children}
      {suffix != null && (
        <span className="pointer-events-none absolute inset-y-0 right-3 flex items-center text-sm text-ink-subtle" aria-hidden="true">
          {suffix}
        </span>
      )}
    </div>
  );
}
