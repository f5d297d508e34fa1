import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link } from 'react-router-dom';
import type { z } from 'zod';
import { forgotPasswordInput } from '@shared/schemas/auth';
import { Button, FormError, TextField, fieldProblemsSummary } from '@/components/ui';
import { applyFieldErrors } from '@/lib/api-client';
import { paths } from '@/config/paths';
import { AuthLayout } from '../components/auth-layout';
import { useForgotPassword } from '../api/forgot-password';

type Values = z.input<typeof forgotPasswordInput>;

export default function ForgotPasswordPage() {
  const forgot = useForgotPassword();
  const form = useForm<Values>({ resolver: zodResolver(forgotPasswordInput), defaultValues: { email: '' } });
  const { errors, isSubmitted } = form.formState;
  // After a submit, every field problem is also summed up in the form's alert, so it is announced.
  const fieldProblems = fieldProblemsSummary(isSubmitted, errors);

  const [formError, setFormError] = useState<string | null>(null);

  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      await forgot.mutateAsync({ email: values.email.trim().toLowerCase() });
    } catch (err) {
      if (!applyFieldErrors(err, form.setError)) setFormError(err instanceof Error ? err.message : 'Try again in a moment.');
    }
  });

  const back = (
    <Link to={paths.login} className="focus-ring rounded-control text-accent underline">
      Back to sign-in
    </Link>
  );

  if (forgot.isSuccess) {
    return (
      <AuthLayout title="Check your e-mail" footer={back}>
        <p role="status" className="text-ink">
          {forgot.data.message} The link works once and expires after a short while. If nothing arrives, check the spam folder or ask the shop owner.
        </p>
      </AuthLayout>
    );
  }

  return (
    <AuthLayout title="Reset your password" subtitle="Enter the e-mail address you sign in with; we will send a link to choose a new password." footer={back}>
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <FormError error={formError ?? fieldProblems} title="The link was not sent" />
        <TextField label="E-mail" type="email" autoComplete="email" autoFocus error={errors.email} {...form.register('email')} />
        <Button type="submit" variant="primary" fullWidth loading={forgot.isPending} loadingText="Sending…">
          Send reset link
        </Button>
      </form>
    </AuthLayout>
  );
}
