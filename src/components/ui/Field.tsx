import type { ReactNode } from 'react';
import { cn } from './cn';
import { useFieldIds, type FieldErrorLike } from './field-utils';
import { Icon } from './Icon';
import { errorTextClass, hintClass, labelClass } from './styles';

/** Props every field wrapper shares. */
export interface FieldBaseProps {
  /** Visible label text, tied to the control with htmlFor/id. */
  label: ReactNode;
  /** Help shown under the label, linked with aria-describedby. */
  hint?: ReactNode;
  /** Error text or a react-hook-form FieldError; sets aria-invalid and is announced with the control. */
  error?: FieldErrorLike;
  /** Hide the label visually (it stays available to screen readers). Use sparingly. */
  hideLabel?: boolean;
  /** Class for the outer wrapper. */
  containerClassName?: string;
}

interface FieldShellProps {
  controlId: string;
  label: ReactNode;
  hint?: ReactNode;
  hintId?: string;
  message?: string;
  errorId?: string;
  required?: boolean;
  hideLabel?: boolean;
  className?: string;
  children: ReactNode;
}

/** Label above, control, then hint and error — the layout every field uses. */
export function FieldShell({
  controlId,
  label,
  hint,
  hintId,
  message,
  errorId,
  required,
  hideLabel,
  className,
  children,
}: FieldShellProps) {
  return (
    <div className={cn('flex flex-col', className)}>
      <label htmlFor={controlId} className={cn(labelClass, 'mb-1.5', hideLabel && 'sr-only')}>
        {label}
        {required && (
          <span className="ml-1 font-normal text-ink-subtle">
            <span aria-hidden="true">*</span>
            <span className="sr-only">(required)</span>
          </span>
        )}
      </label>
      {hint && (
        <p id={hintId} className={cn(hintClass, 'mt-0 mb-1.5')}>
          {hint}
        </p>
      )}
      {children}
      {message && (
        <p id={errorId} className={errorTextClass}>
          <Icon name="triangle" size={16} className="mt-0.5" />
          <span>{message}</span>
        </p>
      )}
    </div>
  );
}

/** What every labelled control takes besides its own props: the shell's, and the attributes it ties to them. */
export interface LabelledControlProps extends FieldBaseProps {
  id?: string;
  required?: boolean;
  'aria-describedby'?: string;
}

/**
 * The core every field shares: splits a field's props into the shell's (label, hint, error,
 * layout) and the control's, the control getting its id, `required` and ARIA attributes first so
 * the caller's own props (e.g. react-hook-form's `register`) still win.
 */
export function useLabelledControl<P extends LabelledControlProps>(props: P) {
  const { label, hint, error, hideLabel, containerClassName, id, required, 'aria-describedby': describedBy, ...rest } = props;
  const f = useFieldIds({ id, hint, error, describedBy });
  const shell = { controlId: f.controlId, label, hint, hintId: f.hintId, message: f.message, errorId: f.errorId, required, hideLabel, className: containerClassName };
  return { shell, control: { required, ...f.controlProps, ...rest } };
}
