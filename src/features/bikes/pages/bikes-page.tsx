import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { createColumnHelper } from '@tanstack/react-table';
import type { BikeDto } from '@shared/schemas/bike';
import { Button, DataTable, ErrorState, Icon, PageHeader, SearchInput } from '@/components/ui';
import { formatNumber } from '@shared/format';
import { hasRole, useCurrentUser } from '@/lib/auth';
import { useServerTable } from '@/lib/use-server-table';
import { paths } from '@/config/paths';
import { bikeQueries } from '../api/bike-queries';
import { BikeFormDialog } from '../components/bike-form-dialog';
import { formatCc, formatCubicInches } from '@shared/units-display';

const col = createColumnHelper<BikeDto>();
const dash = <span className="text-ink-subtle">—</span>;
const columns = [
  col.accessor('make', {
    header: 'Make',
    cell: (c) => (
      <Link to={paths.bike(c.row.original.id)} className="focus-ring rounded-control font-semibold text-accent underline-offset-2 hover:underline">
        {c.getValue()}
      </Link>
    ),
  }),
  col.accessor('model', {
    header: 'Model',
    cell: (c) => (
      <Link to={paths.bike(c.row.original.id)} className="focus-ring rounded-control underline-offset-2 hover:underline" tabIndex={-1}>
        {c.getValue()}
      </Link>
    ),
  }),
  col.accessor('year', { header: 'Year', meta: { numeric: true }, cell: (c) => c.getValue() ?? dash }),
  col.accessor('customerName', {
    id: 'customer',
    header: 'Owner',
    cell: (c) => (
      <Link to={paths.customer(c.row.original.customerId)} className="focus-ring rounded-control underline-offset-2 hover:underline">
        {c.getValue()}
      </Link>
    ),
  }),
  col.accessor('engineFamily', { header: 'Engine family', enableSorting: false, cell: (c) => c.getValue() ?? dash }),
  col.accessor('displacementCc', {
    header: 'Displacement',
    meta: { numeric: true },
    cell: (c) => {
      const cc = c.getValue();
      return cc === null ? dash : (
        <>
          {formatCc(cc)} <span className="text-ink-muted">· {formatCubicInches(cc)}</span>
        </>
      );
    },
  }),
  col.accessor('cylinders', { header: 'Cyl.', enableSorting: false, meta: { numeric: true }, cell: (c) => formatNumber(c.getValue()) }),
];

export default function BikesPage() {
  const user = useCurrentUser();
  const canEdit = hasRole(user, ['owner', 'desk']);
  const navigate = useNavigate();
  const [params, setParams] = useSearchParams();
  const { search, onSearchChange, q, list, tableProps } = useServerTable({ defaultSort: [{ id: 'make', desc: false }], query: bikeQueries.list });
  const creating = canEdit && params.get('new') === '1';
  const presetCustomer = params.get('customerId') ?? undefined;

  const setCreating = (open: boolean) =>
    setParams(
      (p) => {
        if (open) p.set('new', '1');
        else {
          p.delete('new');
          p.delete('customerId');
        }
        return p;
      },
      { replace: true },
    );

  return (
    <>
      <PageHeader
        title="Bikes"
        subtitle={list.data ? `${formatNumber(list.data.total)} ${list.data.total === 1 ? 'bike' : 'bikes'}${q ? ` matching “${q}”` : ' on file'}` : 'Every bike the shop has worked on'}
        action={
          canEdit && (
            <Button variant="primary" icon={<Icon name="plus" size={18} />} onClick={() => setCreating(true)}>
              New bike
            </Button>
          )
        }
      />
      <SearchInput
        label="Search bikes"
        placeholder="Make, model, VIN, engine family or owner"
        value={search}
        onValueChange={onSearchChange}
        containerClassName="mb-4 max-w-md"
      />
      {list.isError && !list.data ? (
        <ErrorState error={list.error} onRetry={() => list.refetch()} isRetrying={list.isFetching} />
      ) : (
        <DataTable
          caption="Bikes"
          columns={columns}
          getRowId={(b) => b.id}
          {...tableProps}
          maxHeight={null}
          emptyMessage={q ? <>No bike matches “{q}”.</> : canEdit ? <>No bikes yet. Add one with “New bike”, or from the customer’s page.</> : <>No bikes yet.</>}
        />
      )}
      <BikeFormDialog open={creating} customerId={presetCustomer} onClose={() => setCreating(false)} onSaved={(b) => navigate(paths.bike(b.id))} />
    </>
  );
}
