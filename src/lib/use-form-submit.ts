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

/**
 * The submit of an invitation form (a colleague, or a customer's portal access): sends it, says
 * where it went, marks the e-mail field when someone already signs in with it, then `afterSent`.
 */
export function useInvitationSubmit<TValues extends FieldValues, TOut extends { email: string }>(form: UseFormReturn<TValues, unknown, TOut>, send: (values: TOut) => Promise<unknown>, afterSent: () => void) {
  const toast = useToast();
  return useFormSubmit(
    form,
    async (values) => {
      await send(values);
      toast.success(`Invitation sent to ${values.email}`, { description: 'The link in it is valid for 7 days.' });
      afterSent();
    },
    { failureToast: 'The invitation was not sent', onRefused: emailTaken(form) },
  );
}

export interface SaveDialogOptions<TOut, TSaved> {
  /** True when editing a record; false when the dialog adds a new one. */
  editing: boolean;
  create: (values: TOut) => Promise<TSaved>;
  update: (values: TOut) => Promise<TSaved>;
  /** "Bike", "Customer": the toasts say "Bike saved" and "The bike was not added". */
  noun: string;
  /** The toast after adding, e.g. "Ada Lovelace added". */
  added: (saved: TSaved) => string;
  onClose: () => void;
  onSaved?: (saved: TSaved) => void;
}

/** The submit of an add-or-edit dialog: create or update, a toast, close, then hand the record back. */
export function useSaveDialogSubmit<TValues extends FieldValues, TOut, TSaved>(form: UseFormReturn<TValues, unknown, TOut>, o: SaveDialogOptions<TOut, TSaved>) {
  const toast = useToast();
  return useFormSubmit(
    form,
    async (values) => {
      const saved = o.editing ? await o.update(values) : await o.create(values);
      toast.success(o.editing ? `${o.noun} saved` : o.added(saved));
      o.onClose();
      o.onSaved?.(saved);
    },
    { failureToast: o.editing ? 'The changes were not saved' : `The ${o.noun.toLowerCase()} was not added` },
  );
}
