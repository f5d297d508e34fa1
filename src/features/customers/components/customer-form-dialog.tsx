import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { customerInput, type CustomerDto, type CustomerInput } from '@shared/schemas/customer';
import { FormDialog, TextAreaField, TextField } from '@/components/ui';
import { useSaveDialogSubmit } from '@/lib/use-form-submit';
import { useCreateCustomer, type CustomerData } from '../api/create-customer';
import { useUpdateCustomer } from '../api/update-customer';

export interface CustomerFormDialogProps {
  open: boolean;
  onClose: () => void;
  /** Edit this customer; without it the dialog adds a new one. */
  customer?: CustomerDto;
  onSaved?: (customer: CustomerDto) => void;
}

/** Add or edit a customer. Mounted only while open, so each opening starts from fresh values. */
export function CustomerFormDialog(props: CustomerFormDialogProps) {
  if (!props.open) return null;
  return <CustomerFormDialogBody {...props} />;
}

function CustomerFormDialogBody({ onClose, customer, onSaved }: CustomerFormDialogProps) {
  const create = useCreateCustomer();
  const update = useUpdateCustomer(customer?.id ?? '');
  const saving = create.isPending || update.isPending;
  const form = useForm<CustomerInput, unknown, CustomerData>({
    resolver: zodResolver(customerInput),
    mode: 'onTouched',
    defaultValues: { name: customer?.name ?? '', email: customer?.email ?? '', phone: customer?.phone ?? '', notes: customer?.notes ?? '' },
  });
  const { errors } = form.formState;

  const { onSubmit, alert } = useSaveDialogSubmit(form, {
    editing: Boolean(customer),
    create: create.mutateAsync,
    update: update.mutateAsync,
    noun: 'Customer',
    added: (saved) => `${saved.name} added`,
    onClose,
    onSaved,
  });

  return (
    <FormDialog
      open
      onClose={onClose}
      busy={saving}
      title={customer ? `Edit ${customer.name}` : 'New customer'}
      description={customer ? undefined : 'Who the bike belongs to. Only the name is required.'}
      formId="customer-form"
      onSubmit={onSubmit}
      submitLabel={customer ? 'Save changes' : 'Add customer'}
      busyLabel="Saving…"
      formError={alert}
    >
        <TextField label="Name" required autoComplete="off" autoFocus error={errors.name} {...form.register('name')} />
        <div className="grid gap-4 md:grid-cols-2">
          <TextField label="E-mail" type="email" autoComplete="off" hint="Where gain reports are sent." error={errors.email} {...form.register('email')} />
          <TextField label="Phone" type="tel" autoComplete="off" error={errors.phone} {...form.register('phone')} />
        </div>
        <TextAreaField label="Notes" rows={3} hint="Only the shop sees these." error={errors.notes} {...form.register('notes')} />
    </FormDialog>
  );
}
