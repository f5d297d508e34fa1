import type { ComponentProps } from 'react';
import { cn } from './cn';
import { FieldShell, type FieldBaseProps } from './Field';
import { useFieldIds } from './field-utils';
import { controlClass } from './styles';

export interface TextAreaFieldProps extends FieldBaseProps, Omit<ComponentProps<'textarea'>, 'children'> {}

/** A labelled multi-line text input, e.g. a run note. */
export function TextAreaField({
  label,
  hint,
  error,
  hideLabel,
  containerClassName,
  id,
  className,
  rows = 3,
  required,
  'aria-describedby': describedBy,
  ...textareaProps
}: TextAreaFieldProps) {
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
      <textarea
        rows={rows}
        required={required}
        className={cn(controlClass, 'resize-y leading-snug', className)}
        {...f.controlProps}
        {...textareaProps}
      />
    </FieldShell>
  );
}
