import { useId } from 'react';

/**
 * A field error as react-hook-form hands it over (`errors.name`), or plain text.
 * Only `message` is read, so any object with an optional message fits.
 */
export type FieldErrorLike = string | { message?: string | undefined } | null | undefined | false;

export function errorMessage(error: FieldErrorLike): string | undefined {
  if (!error) return undefined;
  if (typeof error === 'string') return error || undefined;
  return error.message || undefined;
}

/** After a submit, one sentence naming every field problem, for the form's alert (null when there is none). */
export function fieldProblemsSummary(isSubmitted: boolean, errors: object): string | null {
  return isSubmitted && Object.keys(errors).length ? `Check the fields marked below: ${(Object.values(errors) as FieldErrorLike[]).map((e) => errorMessage(e)).filter(Boolean).join('; ')}.` : null;
}

export interface FieldIdsInput {
  id?: string;
  hint?: unknown;
  error?: FieldErrorLike;
  /** aria-describedby passed by the caller, kept alongside ours. */
  describedBy?: string;
}

/** Ids tying a control to its label, hint and error, plus the ARIA attributes for the control. */
export function useFieldIds({ id, hint, error, describedBy }: FieldIdsInput) {
  const autoId = useId();
  const controlId = id ?? `field-${autoId}`;
  const hintId = hint ? `${controlId}-hint` : undefined;
  const message = errorMessage(error);
  const errorId = message ? `${controlId}-error` : undefined;
  const ariaDescribedBy = [errorId, hintId, describedBy].filter(Boolean).join(' ') || undefined;
  return {
    controlId,
    hintId,
    errorId,
    message,
    controlProps: {
      id: controlId,
      'aria-describedby': ariaDescribedBy,
      'aria-invalid': message ? (true as const) : undefined,
    },
  };
}
