import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { createColumnHelper } from '@tanstack/react-table';
import type { BikeDto } from '@shared/schemas/bike';
import { formatNumber } from '@shared/format';
import { hasRole, useCurrentUser } from '@/lib/auth';
import { ServerListPage, useNewDialogParam } from '@/lib/server-list-page';
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
  const [params] = useSearchParams();
  const [newParam, setCreating] = useNewDialogParam(['customerId']);
  const creating = canEdit && newParam;
  const presetCustomer = params.get('customerId') ?? undefined;

  return (
    <ServerListPage
      title="Bikes"
      noun={['bike', 'bikes']}
      unfilteredSuffix=" on file"
      idleSubtitle="Every bike the shop has worked on"
      newButton={canEdit ? { label: 'New bike', onClick: () => setCreating(true) } : undefined}
      searchLabel="Search bikes"
      searchPlaceholder="Make, model, VIN, engine family or owner"
      columns={columns}
      getRowId={(b) => b.id}
      emptyMessage={(q) => (q ? <>No bike matches “{q}”.</> : canEdit ? <>No bikes yet. Add one with “New bike”, or from the customer’s page.</> : <>No bikes yet.</>)}
      defaultSort={[{ id: 'make', desc: false }]}
      query={bikeQueries.list}
    >
      <BikeFormDialog open={creating} customerId={presetCustomer} onClose={() => setCreating(false)} onSaved={(b) => navigate(paths.bike(b.id))} />
    </ServerListPage>
  );
}
