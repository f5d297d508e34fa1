import type { ComponentProps, ReactNode } from 'react';
import { cn } from './cn';
import { FieldShell, type FieldBaseProps } from './Field';
import { useFieldIds } from './field-utils';
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
export function TextField({
  label,
  hint,
  error,
  hideLabel,
  containerClassName,
  prefix,
  suffix,
  id,
  className,
  type = 'text',
  required,
  'aria-describedby': describedBy,
  ...inputProps
}: TextFieldProps) {
  const f = useFieldIds({ id, hint, error, describedBy });
  return (
    <FieldShell
      controlId={f.controlId}
      label={label}
      hint={hint}
      hintId={f.hintId}
      message={f.message}
      errorId={f.errorId}
      required={required}
      hideLabel={hideLabel}
      className={containerClassName}
    >
      <AffixWrapper prefix={prefix} suffix={suffix}>
        <input
          type={type}
          required={required}
          className={cn(controlClass, prefix != null && 'pl-9', suffix != null && 'pr-14', className)}
          {...f.controlProps}
          {...inputProps}
        />
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
