import type { ComponentProps } from 'react';
import { cn } from './cn';
import { FieldShell, useLabelledControl, type FieldBaseProps } from './Field';
import { controlClass } from './styles';

export interface TextAreaFieldProps extends FieldBaseProps, Omit<ComponentProps<'textarea'>, 'children'> {}

/** A labelled multi-line text input, e.g. a run note. */
export function TextAreaField({ className, rows = 3, ...props }: TextAreaFieldProps) {
  const { shell, control } = useLabelledControl(props);
  return (
    <FieldShell {...shell}>
      <textarea rows={rows} className={cn(controlClass, 'resize-y leading-snug', className)} {...control} />
    </FieldShell>
  );
}
