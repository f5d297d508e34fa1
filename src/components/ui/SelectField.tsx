import type { ComponentProps } from 'react';
import { cn } from './cn';
import { FieldShell, useLabelledControl, type FieldBaseProps } from './Field';
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
export function SelectField({ options, placeholder, className, children, ...props }: SelectFieldProps) {
  const { shell, control } = useLabelledControl(props);
  return (
    <FieldShell {...shell}>
      <div className="relative">
        <select className={cn(controlClass, 'appearance-none pr-10', className)} {...control}>
          {placeholder !== undefined && <option value="">{placeholder}</option>}
          {options?.map((option) => (
            <option key={option.value} value={option.value} disabled={option.disabled}>
              {option.label}
            </option>
          ))}
          {children}
        </select>
        <Icon name="chevron-down" size={18} className="pointer-events-none absolute right-3 top-1/2 -translate-y-1/2 text-ink-muted" />
      </div>
    </FieldShell>
  );
}
