import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link, useNavigate, useParams } from 'react-router-dom';
import type { CustomerDto } from '@shared/schemas/customer';
import { ccToCubicInches } from '@shared/displacement';
import { Button, Card, ConfirmDialog, Dialog, EmptyState, ErrorState, Icon, LoadingState, PageHeader, StatusBadge, useToast } from '@/components/ui';
import { ApiError } from '@/lib/api-client';
import { formatDate, formatNumber } from '@shared/format';
import { hasRole, useCurrentUser } from '@/lib/auth';
import { paths } from '@/config/paths';
import { customerQueries } from '../api/customer-queries';
import { useDeleteCustomer } from '../api/delete-customer';
import { CustomerFormDialog } from '../components/customer-form-dialog';
import { PortalAccessDialog } from '../components/portal-access-dialog';
import { bikeLabel } from '@shared/labels';
import { usePageTitle } from '@/lib/page-title';

export default function CustomerPage() {
  const { customerId = '' } = useParams();
  const customer = useQuery(customerQueries.detail(customerId));
  usePageTitle(customer.data?.name ?? 'Customer');

  if (customer.isPending) return <LoadingState message="Loading the customer…" />;
  if (customer.isError) {
    if (customer.error instanceof ApiError && (customer.error.status === 404 || customer.error.status === 400)) {
      return (
        <EmptyState
          title="No such customer"
          message="This customer does not exist in your shop, or has been deleted."
          action={
            <Link className="text-accent underline" to={paths.customers}>
              All customers
            </Link>
          }
        />
      );
    }
    return <ErrorState error={customer.error} onRetry={() => customer.refetch()} isRetrying={customer.isFetching} />;
  }
  return <CustomerView customer={customer.data} />;
}

function CustomerView({ customer }: { customer: CustomerDto }) {
  const user = useCurrentUser();
  const isOwner = user.role === 'owner';
  const canEdit = hasRole(user, ['owner', 'desk']);
  const [editing, setEditing] = useState(false);
  const [inviting, setInviting] = useState(false);
  const [deleting, setDeleting] = useState(false);
  const del = useDeleteCustomer(customer.id);
  const toast = useToast();
  const navigate = useNavigate();

  const onDelete = async () => {
    try {
      await del.mutateAsync();
      toast.success(`${customer.name} deleted`);
      navigate(paths.customers, { replace: true });
    } catch (err) {
      toast.error('The customer was not deleted', { description: err instanceof Error ? err.message : undefined });
      setDeleting(false);
    }
  };

  return (
    <>
      <PageHeader
        back={
          <Link to={paths.customers} className="focus-ring inline-flex items-center gap-1 rounded-control text-ink-muted hover:text-ink">
            <Icon name="chevron-left" size={16} /> All customers
          </Link>
        }
        title={customer.name}
        subtitle={`Customer since ${formatDate(customer.createdAt)}`}
        secondaryActions={
          <>
            {isOwner && (
              <Button variant="ghost" onClick={() => setDeleting(true)}>
                Delete
              </Button>
            )}
            {canEdit && <Button onClick={() => setEditing(true)}>Edit</Button>}
          </>
        }
      />
      <div className="grid gap-6 lg:grid-cols-3">
        <Card title="Contact" className="lg:col-span-2">
          <dl className="grid grid-cols-1 gap-x-6 gap-y-3 sm:grid-cols-[max-content_1fr]">
            <dt className="text-ink-muted">E-mail</dt>
            <dd className="break-all">{customer.email ? <a className="text-accent underline" href={`mailto:${customer.email}`}>{customer.email}</a> : <span className="text-ink-subtle">Not given</span>}</dd>
            <dt className="text-ink-muted">Phone</dt>
            <dd>{customer.phone ? <a className="text-accent underline" href={`tel:${customer.phone}`}>{customer.phone}</a> : <span className="text-ink-subtle">Not given</span>}</dd>
            <dt className="text-ink-muted">Notes</dt>
            <dd className="whitespace-pre-line">{customer.notes ?? <span className="text-ink-subtle">None</span>}</dd>
          </dl>
        </Card>
        <Card title="Portal access" description="Lets the rider sign in and see their own bikes, read-only.">
          {customer.hasPortalAccess ? (
            <p className="flex flex-wrap items-center gap-2">
              <StatusBadge status="ok">Has a sign-in</StatusBadge>
              {isOwner && (
                <Link to={paths.users} className="text-sm text-accent underline">
                  Manage on the Users page
                </Link>
              )}
            </p>
          ) : isOwner ? (
            <div className="space-y-3">
              <p className="text-ink-muted">{customer.name} cannot sign in yet.</p>
              <Button variant="primary" onClick={() => setInviting(true)}>
                Give portal access
              </Button>
            </div>
          ) : (
            <p className="text-ink-muted">{customer.name} cannot sign in yet. The shop owner can send them an invitation.</p>
          )}
        </Card>
      </div>
      <CustomerBikes customer={customer} canEdit={canEdit} />

      <CustomerFormDialog open={editing} onClose={() => setEditing(false)} customer={customer} />
      {isOwner && <PortalAccessDialog open={inviting} onClose={() => setInviting(false)} customer={customer} />}
      {customer.bikeCount > 0 ? (
        <Dialog open={deleting} onClose={() => setDeleting(false)} size="sm" title={`${customer.name} cannot be deleted yet`} footer={<Button onClick={() => setDeleting(false)}>Close</Button>}>
          <p>
            {customer.name} still has {formatNumber(customer.bikeCount)} {customer.bikeCount === 1 ? 'bike' : 'bikes'} on file. Pullbook keeps a customer while their bikes and runs are in the archive; move the bikes to another customer first.
          </p>
        </Dialog>
      ) : (
        <ConfirmDialog
          open={deleting}
          title={`Delete ${customer.name}?`}
          tone="danger"
          confirmLabel="Delete customer"
          isConfirming={del.isPending}
          onCancel={() => setDeleting(false)}
          onConfirm={onDelete}
        >
          <p>The customer record and its notes are removed. This cannot be undone.</p>
        </ConfirmDialog>
      )}
    </>
  );
}

function CustomerBikes({ customer, canEdit }: { customer: CustomerDto; canEdit: boolean }) {
  const bikes = useQuery(customerQueries.bikes(customer.id));
  const addBikeLink = `${paths.bikes}?new=1&customerId=${customer.id}`;
  return (
    <Card
      title="Bikes"
      className="mt-6"
      flush
      actions={
        canEdit && (
          <Link to={addBikeLink} className="focus-ring inline-flex min-h-10 items-center gap-1.5 rounded-control border border-line-strong px-3 text-sm font-semibold hover:bg-paper-sunk">
            <Icon name="plus" size={16} /> Add bike
          </Link>
        )
      }
    >
      {bikes.isPending ? (
        <LoadingState compact message="Loading bikes…" />
      ) : bikes.isError ? (
        <ErrorState error={bikes.error} onRetry={() => bikes.refetch()} isRetrying={bikes.isFetching} />
      ) : bikes.data.items.length === 0 ? (
        <EmptyState title="No bikes yet" message={canEdit ? 'Add the bike when it is booked in; its runs and reports are filed under it.' : 'The front desk adds bikes when they are booked in.'} />
      ) : (
        <ul className="divide-y divide-line">
          {bikes.data.items.map((b) => (
            <li key={b.id}>
              <Link to={paths.bike(b.id)} className="focus-ring flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1 px-4 py-3 hover:bg-paper-sunk md:px-5">
                <span className="font-semibold text-accent">
                  {bikeLabel(b)}
                </span>
                <span className="num text-sm text-ink-muted">
                  {[b.engineFamily, b.displacementCc !== null ? `${formatNumber(b.displacementCc)} cm³ / ${formatNumber(ccToCubicInches(b.displacementCc), { decimals: 1 })} in³` : null, b.vin].filter(Boolean).join(' · ')}
                </span>
              </Link>
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}
