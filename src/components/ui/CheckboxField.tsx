import type { ComponentProps, ReactNode } from 'react';
import { cn } from './cn';
import type { FieldErrorLike } from './field-utils';
import { useFieldIds } from './field-utils';
import { Icon } from './Icon';
import { errorTextClass, hintClass } from './styles';

export interface CheckboxFieldProps extends Omit<ComponentProps<'input'>, 'type' | 'children'> {
  /** Visible label beside the box; the whole row is the click/touch target. */
  label: ReactNode;
  hint?: ReactNode;
  error?: FieldErrorLike;
  containerClassName?: string;
}

/** A labelled checkbox. Spread `register('name')` in; the ref reaches the input. */
export function CheckboxField({
  label,
  hint,
  error,
  containerClassName,
  id,
  className,
  'aria-describedby': describedBy,
  ...inputProps
}: CheckboxFieldProps) {
  const f = useFieldIds({ id, hint, error, describedBy });
  return (
    <div className={cn('flex flex-col', containerClassName)}>
      <label
        htmlFor={f.controlId}
        className="flex min-h-11 cursor-pointer items-start gap-3 py-2 has-[:disabled]:cursor-not-allowed has-[:disabled]:opacity-60"
      >
        <input
          type="checkbox"
          className={cn(
            'mt-0.5 size-5 shrink-0 cursor-[inherit] rounded border-line-strong accent-accent',
            'focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-focus',
            className,
          )}
          {...f.controlProps}
          {...inputProps}
        />
        <span className="text-base leading-6 text-ink">{label}</span>
      </label>
      {hint && (
        <p id={f.hintId} className={cn(hintClass, 'mt-0 pl-8')}>
          {hint}
        </p>
      )}
      {f.message && (
        <p id={f.errorId} className={cn(errorTextClass, 'pl-8')}>
          <Icon name="triangle" size={16} className="mt-0.5" />
          <span>{f.message}</span>
        </p>
      )}
    </div>
  );
}
