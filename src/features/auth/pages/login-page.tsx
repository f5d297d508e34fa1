import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link, Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { loginInput } from '@shared/schemas/auth';
import type { z } from 'zod';
import { Button, FormError, LoadingState, TextField, fieldProblemsSummary } from '@/components/ui';
import { ApiError, applyFieldErrors } from '@/lib/api-client';
import { useAuth } from '@/lib/auth';
import { paths } from '@/config/paths';
import { AuthLayout, safeNext } from '../components/auth-layout';
import { useState } from 'react';

type LoginValues = z.input<typeof loginInput>;

export default function LoginPage() {
  const { user, isLoading, signIn } = useAuth();
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const next = safeNext(params.get('next'));
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<LoginValues>({ resolver: zodResolver(loginInput), defaultValues: { email: '', password: '' } });
  const { errors, isSubmitting, isSubmitted } = form.formState;
  // After a submit, every field problem is also summed up in the form's alert, so it is announced.
  const fieldProblems = fieldProblemsSummary(isSubmitted, errors);

  if (isLoading) return <LoadingState message="Checking your sign-in…" />;
  if (user) return <Navigate to={next} replace />;

  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      await signIn(values.email.trim().toLowerCase(), values.password);
      navigate(next, { replace: true });
    } catch (err) {
      if (applyFieldErrors(err, form.setError)) return;
      if (err instanceof ApiError && err.status === 429) setFormError('Too many sign-in attempts. Wait a few minutes and try again.');
      else setFormError(err instanceof Error ? err.message : 'Sign-in failed; try again.');
    }
  });

  return (
    <AuthLayout
      title="Sign in"
      subtitle="The shop's run archive and gain reports."
      footer={
        <Link to={paths.forgotPassword} className="focus-ring rounded-control text-accent underline">
          Forgot your password?
        </Link>
      }
    >
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <FormError error={formError ?? fieldProblems} title="Not signed in" />
        <TextField label="E-mail" type="email" autoComplete="username" autoFocus error={errors.email} {...form.register('email')} />
        <TextField label="Password" type="password" autoComplete="current-password" error={errors.password} {...form.register('password')} />
        <Button type="submit" variant="primary" fullWidth loading={isSubmitting} loadingText="Signing in…">
          Sign in
        </Button>
      </form>
    </AuthLayout>
  );
}
