import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { customerInput, type CustomerDto, type CustomerInput } from '@shared/schemas/customer';
import { Button, Dialog, FormError, TextAreaField, TextField, useToast, fieldProblemsSummary } from '@/components/ui';
import { applyFieldErrors } from '@/lib/api-client';
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
  const toast = useToast();
  const create = useCreateCustomer();
  const update = useUpdateCustomer(customer?.id ?? '');
  const saving = create.isPending || update.isPending;
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<CustomerInput, unknown, CustomerData>({
    resolver: zodResolver(customerInput),
    mode: 'onTouched',
    defaultValues: { name: customer?.name ?? '', email: customer?.email ?? '', phone: customer?.phone ?? '', notes: customer?.notes ?? '' },
  });
  const { errors, isSubmitted } = form.formState;
  // After a submit, every field problem is also summed up in the form's alert, so it is announced.
  const fieldProblems = fieldProblemsSummary(isSubmitted, errors);

  const onSubmit = form.handleSubmit(async (data) => {
    setFormError(null);
    try {
      const saved = customer ? await update.mutateAsync(data) : await create.mutateAsync(data);
      toast.success(customer ? 'Customer saved' : `${saved.name} added`);
      onClose();
      onSaved?.(saved);
    } catch (err) {
      if (!applyFieldErrors(err, form.setError)) setFormError(err instanceof Error ? err.message : 'Try again in a moment.');
      toast.error(customer ? 'The changes were not saved' : 'The customer was not added');
    }
  });

  return (
    <Dialog
      open
      onClose={onClose}
      busy={saving}
      title={customer ? `Edit ${customer.name}` : 'New customer'}
      description={customer ? undefined : 'Who the bike belongs to. Only the name is required.'}
      footer={
        <>
          <Button onClick={onClose} disabled={saving}>
            Cancel
          </Button>
          <Button type="submit" form="customer-form" variant="primary" loading={saving} loadingText="Saving…">
            {customer ? 'Save changes' : 'Add customer'}
          </Button>
        </>
      }
    >
      <form id="customer-form" onSubmit={onSubmit} noValidate className="space-y-4">
        <FormError error={formError ?? fieldProblems} />
        <TextField label="Name" required autoComplete="off" autoFocus error={errors.name} {...form.register('name')} />
        <div className="grid gap-4 md:grid-cols-2">
          <TextField label="E-mail" type="email" autoComplete="off" hint="Where gain reports are sent." error={errors.email} {...form.register('email')} />
          <TextField label="Phone" type="tel" autoComplete="off" error={errors.phone} {...form.register('phone')} />
        </div>
        <TextAreaField label="Notes" rows={3} hint="Only the shop sees these." error={errors.notes} {...form.register('notes')} />
      </form>
    </Dialog>
  );
}
