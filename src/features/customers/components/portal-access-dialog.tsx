import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { inviteUserInput } from '@shared/schemas/auth';
import type { CustomerDto } from '@shared/schemas/customer';
import { FormDialog, TextField } from '@/components/ui';
import { useInvitationSubmit } from '@/lib/use-form-submit';
import { useGivePortalAccess } from '../api/give-portal-access';

const portalInviteForm = inviteUserInput.pick({ name: true, email: true });
type Values = z.input<typeof portalInviteForm>;

/** Owner only: invite the customer to sign in and see their own bikes. */
export function PortalAccessDialog({ open, onClose, customer }: { open: boolean; onClose: () => void; customer: CustomerDto }) {
  if (!open) return null;
  return <PortalAccessDialogBody onClose={onClose} customer={customer} />;
}

function PortalAccessDialogBody({ onClose, customer }: { onClose: () => void; customer: CustomerDto }) {
  const invite = useGivePortalAccess(customer.id);
  const form = useForm<Values, unknown, z.output<typeof portalInviteForm>>({
    resolver: zodResolver(portalInviteForm),
    mode: 'onTouched',
    defaultValues: { name: customer.name, email: customer.email ?? '' },
  });
  const { errors } = form.formState;

  const { onSubmit, alert } = useInvitationSubmit(form, invite.mutateAsync, onClose);

  return (
    <FormDialog
      open
      onClose={onClose}
      busy={invite.isPending}
      title="Give portal access"
      description={`${customer.name} gets an e-mail with a link to choose a password. Signed in, they see only their own bikes and reports, and cannot change anything.`}
      formId="portal-form"
      onSubmit={onSubmit}
      submitLabel="Send invitation"
      busyLabel="Sending…"
      formError={alert}
      formErrorTitle="The invitation was not sent"
    >
        <TextField label="Name on the account" required error={errors.name} {...form.register('name')} />
        <TextField label="E-mail for signing in" type="email" required autoComplete="off" error={errors.email} {...form.register('email')} />
    </FormDialog>
  );
}
