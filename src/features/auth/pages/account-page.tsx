import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { changePasswordInput } from '@shared/schemas/auth';
import { ROLE_LABELS } from '@shared/roles';
import { Card, FormError, PageHeader, SubmitRow, TextField, useToast } from '@/components/ui';
import { useFormSubmit } from '@/lib/use-form-submit';
import { useCurrentUser } from '@/lib/auth';
import { useChangePassword } from '../api/change-password';
import { PasswordMeter } from '../components/password-meter';
import { usePageTitle } from '@/lib/page-title';

const changePasswordForm = changePasswordInput
  .extend({ confirm: z.string() })
  .refine((v) => v.newPassword === v.confirm, { path: ['confirm'], message: 'The two passwords are not the same' });
type Values = z.input<typeof changePasswordForm>;

export default function AccountPage() {
  usePageTitle('My account');
  const user = useCurrentUser();
  const toast = useToast();
  const change = useChangePassword();
  const form = useForm<Values>({ resolver: zodResolver(changePasswordForm), defaultValues: { currentPassword: '', newPassword: '', confirm: '' } });
  const { errors } = form.formState;
  const { onSubmit, alert } = useFormSubmit(
    form,
    async ({ currentPassword, newPassword }) => {
      await change.mutateAsync({ currentPassword, newPassword });
      form.reset();
      toast.success('Password changed');
    },
    { failureToast: 'The password was not changed' },
  );

  return (
    <>
      <PageHeader title="My account" subtitle="Your sign-in details. The shop owner manages names and roles." />
      <div className="grid gap-6 lg:grid-cols-2">
        <Card title="Details">
          <dl className="grid grid-cols-[max-content_1fr] gap-x-6 gap-y-3">
            <dt className="text-ink-muted">Name</dt>
            <dd className="font-medium">{user.name}</dd>
            <dt className="text-ink-muted">E-mail</dt>
            <dd className="font-medium break-all">{user.email}</dd>
            <dt className="text-ink-muted">Role</dt>
            <dd className="font-medium">{ROLE_LABELS[user.role]}</dd>
          </dl>
        </Card>
        <Card title="Change password">
          <form onSubmit={onSubmit} noValidate className="space-y-4">
            <FormError error={alert} title="The password was not changed" />
            <input type="text" name="username" autoComplete="username" value={user.email} readOnly hidden />
            <TextField label="Current password" type="password" autoComplete="current-password" error={errors.currentPassword} {...form.register('currentPassword')} />
            <TextField label="New password" type="password" autoComplete="new-password" hint="At least 10 characters." error={errors.newPassword} {...form.register('newPassword')} />
            <PasswordMeter password={form.watch('newPassword')} userInputs={[user.email, user.name]} />
            <TextField label="Type the password again" type="password" autoComplete="new-password" error={errors.confirm} {...form.register('confirm')} />
            <SubmitRow busy={change.isPending} busyLabel="Saving…">
              Change password
            </SubmitRow>
          </form>
        </Card>
      </div>
    </>
  );
}
