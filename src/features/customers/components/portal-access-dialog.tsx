import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { inviteUserInput } from '@shared/schemas/auth';
import type { CustomerDto } from '@shared/schemas/customer';
import { Button, Dialog, FormError, TextField, useToast, fieldProblemsSummary } from '@/components/ui';
import { ApiError, applyFieldErrors } from '@/lib/api-client';
import { useGivePortalAccess } from '../api/give-portal-access';

const portalInviteForm = inviteUserInput.pick({ name: true, email: true });
type Values = z.input<typeof portalInviteForm>;

/** Owner only: invite the customer to sign in and see their own bikes. */
export function PortalAccessDialog({ open, onClose, customer }: { open: boolean; onClose: () => void; customer: CustomerDto }) {
  if (!open) return null;
  return <PortalAccessDialogBody onClose={onClose} customer={customer} />;
}

function PortalAccessDialogBody({ onClose, customer }: { onClose: () => void; customer: CustomerDto }) {
  const toast = useToast();
  const invite = useGivePortalAccess(customer.id);
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<Values, unknown, z.output<typeof portalInviteForm>>({
    resolver: zodResolver(portalInviteForm),
    mode: 'onTouched',
    defaultValues: { name: customer.name, email: customer.email ?? '' },
  });
  const { errors, isSubmitted } = form.formState;
  // After a submit, every field problem is also summed up in the form's alert, so it is announced.
  const fieldProblems = fieldProblemsSummary(isSubmitted, errors);

  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      await invite.mutateAsync(values);
      toast.success(`Invitation sent to ${values.email}`, { description: 'The link in it is valid for 7 days.' });
      onClose();
    } catch (err) {
      if (err instanceof ApiError && err.code === 'EMAIL_TAKEN') form.setError('email', { message: 'Someone already signs in with this address' });
      else if (!applyFieldErrors(err, form.setError)) setFormError(err instanceof Error ? err.message : 'Try again in a moment.');
      toast.error('The invitation was not sent');
    }
  });

  return (
    <Dialog
      open
      onClose={onClose}
      busy={invite.isPending}
      title="Give portal access"
      description={`${customer.name} gets an e-mail with a link to choose a password. Signed in, they see only their own bikes and reports, and cannot change anything.`}
      footer={
        <>
          <Button onClick={onClose} disabled={invite.isPending}>
            Cancel
          </Button>
          <Button type="submit" form="portal-form" variant="primary" loading={invite.isPending} loadingText="Sending…">
            Send invitation
          </Button>
        </>
      }
    >
      <form id="portal-form" onSubmit={onSubmit} noValidate className="space-y-4">
        <FormError error={formError ?? fieldProblems} title="The invitation was not sent" />
        <TextField label="Name on the account" required error={errors.name} {...form.register('name')} />
        <TextField label="E-mail for signing in" type="email" required autoComplete="off" error={errors.email} {...form.register('email')} />
      </form>
    </Dialog>
  );
}
