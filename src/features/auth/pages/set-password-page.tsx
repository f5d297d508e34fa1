import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { z } from 'zod';
import { passwordSchema } from '@shared/schemas/auth';
import { Button, ErrorState, FormError, LoadingState, TextField, useToast, fieldProblemsSummary } from '@/components/ui';
import { ApiError, applyFieldErrors } from '@/lib/api-client';
import { paths } from '@/config/paths';
import { AuthLayout } from '../components/auth-layout';
import { PasswordMeter } from '../components/password-meter';
import { authQueries, type TokenInfo } from '../api/auth-queries';
import { useSetPassword } from '../api/set-password';

const setPasswordForm = z
  .object({
    name: z.string().trim().max(200),
    password: passwordSchema,
    confirm: z.string(),
  })
  .refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords are not the same' });
type Values = z.input<typeof setPasswordForm>;

/**
 * One page for both kinds of e-mailed link: an invitation (choose a password, confirm your name)
 * and a password reset. It first asks the server whose link it is, so the person sees which
 * account they are about to set up.
 */
export default function SetPasswordPage({ purpose }: { purpose: 'invite' | 'reset' }) {
  const { token = '' } = useParams();
  const info = useQuery(authQueries.token(token));
  const isInvite = purpose === 'invite';
  const title = isInvite ? 'Set up your account' : 'Choose a new password';

  if (info.isPending) return <LoadingState message="Checking your link…" />;
  if (info.isError) {
    const dead = info.error instanceof ApiError && info.error.status < 500;
    return (
      <AuthLayout
        title={title}
        footer={
          <Link to={paths.login} className="focus-ring rounded-control text-accent underline">
            Go to sign-in
          </Link>
        }
      >
        {dead ? (
          <div role="alert" className="space-y-3 text-ink">
            <p className="font-semibold">This link no longer works.</p>
            <p className="text-ink-muted">
              Links work once and expire after a while.{' '}
              {isInvite ? 'Ask the shop owner to send a fresh invitation.' : <>You can <Link className="text-accent underline" to={paths.forgotPassword}>ask for a new reset link</Link>.</>}
            </p>
          </div>
        ) : (
          <ErrorState error={info.error} onRetry={() => info.refetch()} isRetrying={info.isFetching} />
        )}
      </AuthLayout>
    );
  }

  return <SetPasswordForm token={token} info={info.data} isInvite={isInvite} title={title} />;
}

function SetPasswordForm({ token, info, isInvite, title }: { token: string; info: TokenInfo; isInvite: boolean; title: string }) {
  const setPassword = useSetPassword();
  const navigate = useNavigate();
  const toast = useToast();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<Values>({ resolver: zodResolver(setPasswordForm), defaultValues: { name: info.name, password: '', confirm: '' } });
  const { errors, isSubmitted } = form.formState;
  // After a submit, every field problem is also summed up in the form's alert, so it is announced.
  const fieldProblems = fieldProblemsSummary(isSubmitted, errors);

  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      const { user } = await setPassword.mutateAsync({ token, password: values.password, ...(isInvite && values.name.trim() ? { name: values.name.trim() } : {}) });
      toast.success(isInvite ? `Welcome, ${user.name}. Your account is ready.` : 'Password changed. You are signed in.');
      navigate(paths.home, { replace: true });
    } catch (err) {
      if (!applyFieldErrors(err, form.setError)) setFormError(err instanceof Error ? err.message : 'Try again in a moment.');
    }
  });

  return (
    <AuthLayout
      title={title}
      subtitle={
        isInvite ? (
          <>
            Invitation for <strong className="text-ink">{info.name}</strong> ({info.email}). Choose a password to finish.
          </>
        ) : (
          <>
            For <strong className="text-ink">{info.email}</strong>.
          </>
        )
      }
    >
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <FormError error={formError ?? fieldProblems} title="The password was not set" />
        <input type="text" name="username" autoComplete="username" value={info.email} readOnly hidden />
        {isInvite && <TextField label="Your name" autoComplete="name" hint="As the shop will see it. Change it if it is not right." error={errors.name} {...form.register('name')} />}
        <TextField label="New password" type="password" autoComplete="new-password" hint="At least 10 characters." error={errors.password} {...form.register('password')} />
        <PasswordMeter password={form.watch('password')} userInputs={[info.email, info.name, form.watch('name')]} />
        <TextField label="Type the password again" type="password" autoComplete="new-password" error={errors.confirm} {...form.register('confirm')} />
        <Button type="submit" variant="primary" fullWidth loading={setPassword.isPending} loadingText="Saving…">
          {isInvite ? 'Set password and sign in' : 'Change password and sign in'}
        </Button>
        {isInvite && <p className="text-sm text-ink-subtle">You will sign in with {info.email}. What you can see is set by the shop.</p>}
      </form>
    </AuthLayout>
  );
}
