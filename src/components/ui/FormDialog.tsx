import type { FormEventHandler, ReactNode } from 'react';
import { Button, type ButtonVariant } from './Button';
import { Dialog, type DialogProps } from './Dialog';
import { FormError, type FormErrorProps } from './FormError';

export interface DialogActionsProps {
  onCancel: () => void;
  /** Default "Cancel". */
  cancelLabel?: ReactNode;
  /** Default the button's own default (secondary). */
  cancelVariant?: ButtonVariant;
  submitLabel: ReactNode;
  /** Shown on the submit button while busy, e.g. "Saving…". */
  busyLabel: string;
  busy: boolean;
  /** Submit a form by id (footer buttons sit outside the form), or run an action on click. */
  submit: { form: string } | { onClick: () => void };
  submitDisabled?: boolean;
}

/** A dialog's footer: Cancel (disabled while busy) and the primary action. */
export function DialogActions({ onCancel, cancelLabel = 'Cancel', cancelVariant, submitLabel, busyLabel, busy, submit, submitDisabled }: DialogActionsProps) {
  return (
    <>
      <Button variant={cancelVariant} onClick={onCancel} disabled={busy}>
        {cancelLabel}
      </Button>
      <Button
        variant="primary"
        {...('form' in submit ? { type: 'submit' as const, form: submit.form } : { onClick: submit.onClick })}
        loading={busy}
        loadingText={busyLabel}
        disabled={submitDisabled}
      >
        {submitLabel}
      </Button>
    </>
  );
}

export interface FormDialogProps extends Omit<DialogProps, 'footer' | 'busy' | 'children'> {
  /** The form's id, tying the footer's submit button to it. */
  formId: string;
  onSubmit: FormEventHandler<HTMLFormElement>;
  busy: boolean;
  submitLabel: ReactNode;
  busyLabel: string;
  cancelVariant?: ButtonVariant;
  /** The form-level alert (a server refusal or the summed-up field problems). */
  formError: FormErrorProps['error'];
  formErrorTitle?: ReactNode;
  children: ReactNode;
}

/** A dialog holding one form: the alert on top, the fields, and Cancel / submit in the footer. */
export function FormDialog({ formId, onSubmit, busy, submitLabel, busyLabel, cancelVariant, formError, formErrorTitle, children, ...dialog }: FormDialogProps) {
  return (
    <Dialog
      {...dialog}
      busy={busy}
      footer={<DialogActions onCancel={dialog.onClose} cancelVariant={cancelVariant} submitLabel={submitLabel} busyLabel={busyLabel} busy={busy} submit={{ form: formId }} />}
    >
      <form id={formId} onSubmit={onSubmit} noValidate className="space-y-4">
        <FormError error={formError} title={formErrorTitle} />
        {children}
      </form>
    </Dialog>
  );
}

/** The submit button of a form on a page (not in a dialog), at the form's end. */
export function SubmitRow({ busy, busyLabel, children }: { busy: boolean; busyLabel: string; children: ReactNode }) {
  return (
    <div className="flex justify-end">
      <Button type="submit" variant="primary" loading={busy} loadingText={busyLabel}>
        {children}
      </Button>
    </div>
  );
}
