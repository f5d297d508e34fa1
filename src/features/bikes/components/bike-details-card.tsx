import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { BikeDto } from '@shared/schemas/bike';
import { Card } from '@/components/ui';
import { formatDate, formatNumber } from '@shared/format';
import { paths } from '@/config/paths';
import { formatCc, formatCubicInches } from '@shared/units-display';

const missing = <span className="text-ink-subtle">Not recorded</span>;

/** The bike's identity: who owns it, what it is, and the engine facts the archive groups by. */
export function BikeDetailsCard({ bike, linkCustomer, actions }: { bike: BikeDto; linkCustomer: boolean; actions?: ReactNode }) {
  const rows: [string, ReactNode][] = [
    [
      'Owner',
      linkCustomer ? (
        <Link to={paths.customer(bike.customerId)} className="focus-ring rounded-control font-semibold text-accent underline">
          {bike.customerName}
        </Link>
      ) : (
        bike.customerName
      ),
    ],
    ['Make', bike.make],
    ['Model', bike.model],
    ['Year', bike.year ?? missing],
    ['VIN', bike.vin ? <span className="font-mono tracking-wide break-all">{bike.vin}</span> : missing],
    ['Engine family', bike.engineFamily ?? missing],
    [
      'Displacement',
      bike.displacementCc !== null ? (
        <span className="num">
          {formatCc(bike.displacementCc)} <span className="text-ink-muted">· {formatCubicInches(bike.displacementCc)}</span>
        </span>
      ) : (
        missing
      ),
    ],
    ['Cylinders', bike.cylinders !== null ? <span className="num">{formatNumber(bike.cylinders)}</span> : missing],
  ];
  return (
    <Card title="Bike details" actions={actions} description={`On file since ${formatDate(bike.createdAt)}`}>
      <dl className="grid grid-cols-1 gap-x-8 gap-y-3 sm:grid-cols-2 lg:grid-cols-4">
        {rows.map(([label, value]) => (
          <div key={label} className="min-w-0">
            <dt className="text-sm font-medium text-ink-muted">{label}</dt>
            <dd className="mt-0.5 text-lg text-ink">{value}</dd>
          </div>
        ))}
      </dl>
      {bike.notes && (
        <div className="mt-4 border-t border-line pt-3">
          <h3 className="text-sm font-medium text-ink-muted">Notes</h3>
          <p className="mt-0.5 whitespace-pre-line">{bike.notes}</p>
        </div>
      )}
    </Card>
  );
}
