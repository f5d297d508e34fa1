import type { ComponentProps } from 'react';
import { cn } from './cn';
import { FieldShell, useLabelledControl, type FieldBaseProps } from './Field';
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
export function NumberField({ unit, className, step = 'any', inputMode = 'decimal', ...props }: NumberFieldProps) {
  const label = (
    <>
      {props.label}
      {unit && <span className="sr-only"> ({unit})</span>}
    </>
  );
  const { shell, control } = useLabelledControl({ ...props, label });
  return (
    <FieldShell {...shell}>
      <AffixWrapper suffix={unit}>
        <input type="number" step={step} inputMode={inputMode} className={cn(controlClass, 'num text-right', unit && 'pr-14', className)} {...control} />
      </AffixWrapper>
    </FieldShell>
  );
}
