import { Link, useNavigate } from 'react-router-dom';
import { createColumnHelper } from '@tanstack/react-table';
import type { CustomerDto } from '@shared/schemas/customer';
import { StatusBadge } from '@/components/ui';
import { formatDate, formatNumber } from '@shared/format';
import { hasRole, useCurrentUser } from '@/lib/auth';
import { ServerListPage, useNewDialogParam } from '@/lib/server-list-page';
import { paths } from '@/config/paths';
import { customerQueries } from '../api/customer-queries';
import { CustomerFormDialog } from '../components/customer-form-dialog';

const col = createColumnHelper<CustomerDto>();
const columns = [
  col.accessor('name', {
    header: 'Name',
    cell: (c) => (
      <Link to={paths.customer(c.row.original.id)} className="focus-ring rounded-control font-semibold text-accent underline-offset-2 hover:underline">
        {c.getValue()}
      </Link>
    ),
  }),
  col.accessor('email', { header: 'E-mail', cell: (c) => c.getValue() ?? <span className="text-ink-subtle">—</span> }),
  col.accessor('phone', { header: 'Phone', enableSorting: false, cell: (c) => c.getValue() ?? <span className="text-ink-subtle">—</span> }),
  col.accessor('bikeCount', { header: 'Bikes', enableSorting: false, meta: { numeric: true }, cell: (c) => formatNumber(c.getValue()) }),
  col.accessor('hasPortalAccess', {
    header: 'Portal',
    enableSorting: false,
    cell: (c) => (c.getValue() ? <StatusBadge status="ok">Can sign in</StatusBadge> : <span className="text-ink-subtle">No</span>),
  }),
  col.accessor('createdAt', { header: 'Added', meta: { numeric: true }, cell: (c) => formatDate(c.getValue()) }),
];

export default function CustomersPage() {
  const user = useCurrentUser();
  const canEdit = hasRole(user, ['owner', 'desk']);
  const navigate = useNavigate();
  const [newParam, setCreating] = useNewDialogParam();
  const creating = canEdit && newParam;

  return (
    <ServerListPage
      title="Customers"
      noun={['customer', 'customers']}
      idleSubtitle="Riders and their bikes"
      newButton={canEdit ? { label: 'New customer', onClick: () => setCreating(true) } : undefined}
      searchLabel="Search customers"
      searchPlaceholder="Search by name, e-mail or phone"
      columns={columns}
      getRowId={(c) => c.id}
      emptyMessage={(q) =>
        q ? (
          <>No customer matches “{q}”. Check the spelling, or search by phone number.</>
        ) : canEdit ? (
          <>No customers yet. Add the first one with “New customer”.</>
        ) : (
          <>No customers yet.</>
        )
      }
      defaultSort={[{ id: 'name', desc: false }]}
      query={customerQueries.list}
    >
      <CustomerFormDialog open={creating} onClose={() => setCreating(false)} onSaved={(c) => navigate(paths.customer(c.id))} />
    </ServerListPage>
  );
}
