import { useMemo, useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { Link } from 'react-router-dom';
import { z } from 'zod';
import { inviteUserInput } from '@shared/schemas/auth';
import { ROLE_LABELS, STAFF, type Role } from '@shared/roles';
import { Button, Card, ConfirmDialog, DataTable, ErrorState, FormError, PageHeader, SelectField, StatusBadge, SubmitRow, TextField, useToast } from '@/components/ui';
import { useInvitationSubmit } from '@/lib/use-form-submit';
import { formatDateTime } from '@shared/format';
import { useCurrentUser } from '@/lib/auth';
import { paths } from '@/config/paths';
import { adminQueries, type UserDto } from '../api/admin-queries';
import { useInviteUser } from '../api/invite-user';
import { useUpdateUser } from '../api/update-user';
import { useResendInvite } from '../api/resend-invite';
import { usePageTitle } from '@/lib/page-title';

const staffOptions = STAFF.map((r) => ({ value: r, label: ROLE_LABELS[r] }));
const staffInviteForm = inviteUserInput.pick({ name: true, email: true }).extend({ role: z.enum(['owner', 'tuner', 'desk']) });
type InviteValues = z.input<typeof staffInviteForm>;

/** Owner only: the guard is the settings layout route (../routes.tsx). */
export default function UsersPage() {
  usePageTitle('Users');
  const users = useQuery(adminQueries.users());
  return (
    <>
      <PageHeader title="Users" subtitle="Who can sign in to this shop, and what they may do." />
      <div className="grid gap-6 xl:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
        <div className="min-w-0">
          {users.isError && !users.data ? (
            <ErrorState error={users.error} onRetry={() => users.refetch()} isRetrying={users.isFetching} />
          ) : (
            <UsersTable users={users.data ?? []} isLoading={users.isPending} />
          )}
          <p className="mt-3 text-sm text-ink-muted">
            Owners manage users and settings; tuners upload and tag runs; the front desk keeps customers and bikes and sends reports. Customers see only their own bikes — invite them from their{' '}
            <Link to={paths.customers} className="text-accent underline">
              customer page
            </Link>
            .
          </p>
        </div>
        <InviteCard />
      </div>
    </>
  );
}

function UsersTable({ users, isLoading }: { users: UserDto[]; isLoading: boolean }) {
  const me = useCurrentUser();
  const toast = useToast();
  const update = useUpdateUser();
  const resend = useResendInvite();
  const [toDisable, setToDisable] = useState<UserDto | null>(null);

  const columns = useMemo(() => {
    const col = createColumnHelper<UserDto>();
    const patch = async (u: UserDto, p: { role?: Role; disabled?: boolean }, done: string) => {
      try {
        await update.mutateAsync({ id: u.id, patch: p });
        toast.success(done);
      } catch (err) {
        toast.error('Nothing was changed', { description: err instanceof Error ? err.message : undefined });
      }
    };
    return [
      col.accessor('name', {
        header: 'Name',
        cell: (c) => (
          <span className="font-semibold">
            {c.getValue()}
            {c.row.original.id === me.id && <span className="ml-1 font-normal text-ink-subtle">(you)</span>}
          </span>
        ),
      }),
      col.accessor('email', { header: 'E-mail' }),
      col.accessor('role', {
        header: 'Role',
        cell: (c) => {
          const u = c.row.original;
          if (u.role === 'customer' || u.id === me.id) return ROLE_LABELS[u.role];
          return (
            <SelectField
              label={`Role of ${u.name}`}
              hideLabel
              // Wide enough for the longest role name ("Front desk") plus the chevron, at any table width.
              containerClassName="w-44 min-w-44"
              className="min-h-10 py-1"
              value={u.role}
              disabled={update.isPending}
              options={staffOptions}
              onChange={(e) => patch(u, { role: e.target.value as Role }, `${u.name} is now ${ROLE_LABELS[e.target.value as Role].toLowerCase()}`)}
            />
          );
        },
      }),
      col.display({
        id: 'status',
        header: 'Status',
        cell: (c) => {
          const u = c.row.original;
          if (u.disabled) return <StatusBadge status="error">Disabled</StatusBadge>;
          if (u.invitePending) return <StatusBadge status="pending">Invitation sent</StatusBadge>;
          return <StatusBadge status="ok">Active</StatusBadge>;
        },
      }),
      col.accessor('lastLoginAt', { header: 'Last sign-in', meta: { numeric: true }, cell: (c) => (c.getValue() ? formatDateTime(c.getValue()) : <span className="text-ink-subtle">Never</span>) }),
      col.display({
        id: 'actions',
        header: () => <span className="sr-only">Actions</span>,
        meta: { align: 'right' },
        cell: (c) => {
          const u = c.row.original;
          if (u.id === me.id) return null;
          return (
            <div className="flex justify-end gap-2">
              {u.invitePending && !u.disabled && (
                <Button
                  size="sm"
                  variant="ghost"
                  aria-label={`Resend invitation to ${u.name}`}
                  onClick={async () => {
                    try {
                      await resend.mutateAsync(u.id);
                      toast.success(`A fresh invitation is on its way to ${u.email}`, { description: 'The earlier link no longer works.' });
                    } catch (err) {
                      toast.error('The invitation was not sent', { description: err instanceof Error ? err.message : undefined });
                    }
                  }}
                >
                  Resend invitation
                </Button>
              )}
              {u.disabled ? (
                <Button size="sm" aria-label={`Enable ${u.name}`} onClick={() => patch(u, { disabled: false }, `${u.name} can sign in again`)}>
                  Enable
                </Button>
              ) : (
                <Button size="sm" aria-label={`Disable ${u.name}`} onClick={() => setToDisable(u)}>
                  Disable
                </Button>
              )}
            </div>
          );
        },
      }),
    ];
  }, [me.id, update, resend, toast]);

  return (
    <>
      <DataTable caption="Users of this shop" columns={columns} data={users} getRowId={(u) => u.id} isLoading={isLoading} maxHeight={null} emptyMessage="No users yet." />
      <ConfirmDialog
        open={toDisable !== null}
        title={`Disable ${toDisable?.name}?`}
        tone="danger"
        confirmLabel="Disable"
        isConfirming={update.isPending}
        onCancel={() => setToDisable(null)}
        onConfirm={async () => {
          if (!toDisable) return;
          try {
            await update.mutateAsync({ id: toDisable.id, patch: { disabled: true } });
            toast.success(`${toDisable.name} can no longer sign in`);
          } catch (err) {
            toast.error('Nothing was changed', { description: err instanceof Error ? err.message : undefined });
          }
          setToDisable(null);
        }}
      >
        <p>They are signed out everywhere and cannot sign in until you enable them again. Their runs, notes and history stay in the archive.</p>
      </ConfirmDialog>
    </>
  );
}

function InviteCard() {
  const invite = useInviteUser();
  const form = useForm<InviteValues, unknown, z.output<typeof staffInviteForm>>({ resolver: zodResolver(staffInviteForm), mode: 'onTouched', defaultValues: { name: '', email: '', role: 'tuner' } });
  const { errors } = form.formState;

  const { onSubmit, alert } = useInvitationSubmit(form, invite.mutateAsync, () => form.reset());

  return (
    <Card title="Invite a colleague" description="They get an e-mail with a link to choose a password.">
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <FormError error={alert} title="The invitation was not sent" />
        <TextField label="Name" required autoComplete="off" error={errors.name} {...form.register('name')} />
        <TextField label="E-mail" type="email" required autoComplete="off" error={errors.email} {...form.register('email')} />
        <SelectField label="Role" required options={staffOptions} error={errors.role} {...form.register('role')} />
        <SubmitRow busy={invite.isPending} busyLabel="Sending…">
          Send invitation
        </SubmitRow>
      </form>
    </Card>
  );
}
