import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { createColumnHelper } from '@tanstack/react-table';
import type { CustomerDto } from '@shared/schemas/customer';
import { Button, DataTable, ErrorState, Icon, PageHeader, SearchInput, StatusBadge } from '@/components/ui';
import { formatDate, formatNumber } from '@shared/format';
import { hasRole, useCurrentUser } from '@/lib/auth';
import { useServerTable } from '@/lib/use-server-table';
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
  const [params, setParams] = useSearchParams();
  const { search, onSearchChange, q, list, tableProps } = useServerTable({ defaultSort: [{ id: 'name', desc: false }], query: customerQueries.list });
  const creating = canEdit && params.get('new') === '1';

  const setCreating = (open: boolean) =>
    setParams(
      (p) => {
        if (open) p.set('new', '1');
        else p.delete('new');
        return p;
      },
      { replace: true },
    );

  return (
    <>
      <PageHeader
        title="Customers"
        subtitle={list.data ? `${formatNumber(list.data.total)} ${list.data.total === 1 ? 'customer' : 'customers'}${q ? ` matching “${q}”` : ''}` : 'Riders and their bikes'}
        action={
          canEdit && (
            <Button variant="primary" icon={<Icon name="plus" size={18} />} onClick={() => setCreating(true)}>
              New customer
            </Button>
          )
        }
      />
      <SearchInput
        label="Search customers"
        placeholder="Search by name, e-mail or phone"
        value={search}
        onValueChange={onSearchChange}
        containerClassName="mb-4 max-w-md"
      />
      {list.isError && !list.data ? (
        <ErrorState error={list.error} onRetry={() => list.refetch()} isRetrying={list.isFetching} />
      ) : (
        <DataTable
          caption="Customers"
          columns={columns}
          getRowId={(c) => c.id}
          {...tableProps}
          maxHeight={null}
          emptyMessage={
            q ? (
              <>No customer matches “{q}”. Check the spelling, or search by phone number.</>
            ) : canEdit ? (
              <>No customers yet. Add the first one with “New customer”.</>
            ) : (
              <>No customers yet.</>
            )
          }
        />
      )}
      <CustomerFormDialog open={creating} onClose={() => setCreating(false)} onSaved={(c) => navigate(paths.customer(c.id))} />
    </>
  );
}
