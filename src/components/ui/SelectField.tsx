import type { ComponentProps } from 'react';
import { cn } from './cn';
import { FieldShell, type FieldBaseProps } from './Field';
import { useFieldIds } from './field-utils';
import { Icon } from './Icon';
import { controlClass } from './styles';

export interface SelectOption {
  value: string;
  label: string;
  disabled?: boolean;
}

export interface SelectFieldProps extends FieldBaseProps, ComponentProps<'select'> {
  /** Options to render; or pass `<option>` children instead. */
  options?: readonly SelectOption[];
  /** A first, empty choice such as "Choose a stage…". */
  placeholder?: string;
}

/** A labelled native select (native for keyboard, touch and screen-reader behaviour for free). */
export function SelectField({
  label,
  hint,
  error,
  hideLabel,
  containerClassName,
  options,
  placeholder,
  id,
  className,
  required,
  children,
  'aria-describedby': describedBy,
  ...selectProps
}: SelectFieldProps) {
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
      <div className="relative">
        <select
          required={required}
          className={cn(controlClass, 'appearance-none pr-10', className)}
          {...f.controlProps}
          {...selectProps}
        >
          {placeholder !== undefined && <option value="">{placeholder}</option>}
          {options?.map((option) => (
            <option key={option.value} value={option.value} disabled={option.disabled}>
              {option.label}
            </option>
          ))}
          {children}
        </select>
        <Icon
          name="chevron-down"
          size={18}
          className="pointer-events-none absolute right-3 top-1/2 -translate-y-1/2 text-ink-muted"
        />
      </div>
    </FieldShell>
  );
}
