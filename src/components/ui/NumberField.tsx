import type { ComponentProps } from 'react';
import { cn } from './cn';
import { FieldShell, type FieldBaseProps } from './Field';
import { useFieldIds } from './field-utils';
import { controlClass } from './styles';
import { AffixWrapper } from './TextField';

export interface NumberFieldProps extends FieldBaseProps, Omit<ComponentProps<'input'>, 'children' | 'type' | 'prefix'> {
  /** Unit shown inside the input's end and read out with the label, e.g. "hp", "rpm", "°F". */
  unit?: string;
}

/**
 * A labelled number input with tabular figures. Use `register('name', { valueAsNumber: true })`;
 * an empty box then gives NaN, which the zod schema should reject or map to undefined.
 * `step` defaults to "any" so decimals are accepted without browser complaints.
 */
export function NumberField({
  label,
  hint,
  error,
  hideLabel,
  containerClassName,
  unit,
  id,
  className,
  step = 'any',
  inputMode = 'decimal',
  required,
  'aria-describedby': describedBy,
  ...inputProps
}: NumberFieldProps) {
  const f = useFieldIds({ id, hint, error, describedBy });
  return (
    <FieldShell
      controlId={f.controlId}
      label={
        <>
          {label}
          {unit && <span className="sr-only"> ({unit})</span>}
        </>
      }
      hint={hint}
      hintId={f.hintId}
      message={f.message}
      errorId={f.errorId}
      required={required}
      hideLabel={hideLabel}
      className={containerClassName}
    >
      <AffixWrapper suffix={unit}>
        <input
          type="number"
          step={step}
          inputMode={inputMode}
          required={required}
          className={cn(controlClass, 'num text-right', unit && 'pr-14', className)}
          {...f.controlProps}
          {...inputProps}
        />
      </AffixWrapper>
    </FieldShell>
  );
}
