import { useState } from 'react';
import type { FieldValues, UseFormReturn } from 'react-hook-form';
import { fieldProblemsSummary, useToast } from '@/components/ui';
import { ApiError, applyFieldErrors } from './api-client';

export interface FormSubmitOptions {
  /** Toast shown when the save fails, e.g. "The bike was not added". */
  failureToast?: string;
  /** Handle a refusal specially (e.g. mark one field); return true when handled. */
  onRefused?: (err: unknown) => boolean;
}

/**
 * The submit of a react-hook-form form that saves through the API: server field errors go to
 * their fields, anything else to the form's alert (which also sums up the field problems after a
 * submit, so they are announced), and an optional failure toast.
 */
export function useFormSubmit<TValues extends FieldValues, TOut>(form: UseFormReturn<TValues, unknown, TOut>, save: (values: TOut) => Promise<void>, options: FormSubmitOptions = {}) {
  const toast = useToast();
  const [formError, setFormError] = useState<string | null>(null);
  const { errors, isSubmitted } = form.formState;
  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      await save(values);
    } catch (err) {
      if (!options.onRefused?.(err) && !applyFieldErrors(err, form.setError)) setFormError(err instanceof Error ? err.message : 'Try again in a moment.');
      if (options.failureToast) toast.error(options.failureToast);
    }
  });
  return { onSubmit, alert: formError ?? fieldProblemsSummary(isSubmitted, errors) };
}

/** Marks the e-mail field when the server answers that someone already signs in with it. */
export function emailTaken<TValues extends FieldValues>(form: Pick<UseFormReturn<TValues>, 'setError'>) {
  return (err: unknown) => {
    if (!(err instanceof ApiError && err.code === 'EMAIL_TAKEN')) return false;
    form.setError('email' as never, { message: 'Someone already signs in with this address' });
    return true;
  };
}
