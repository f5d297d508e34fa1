import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import type { BikeDto } from '@shared/schemas/bike';
import { Button, ErrorState, LoadingState, SearchInput, useDebouncedValue } from '@/components/ui';
import { bikeLabel, lookupQueries } from '../api/runs/run-queries';

/** Search the shop's bikes by make, model, VIN or owner and pick one. */
export function BikePicker({ onPick }: { onPick: (bike: BikeDto) => void }) {
  const [q, setQ] = useState('');
  const query = useDebouncedValue(q, 250);
  const bikes = useQuery(lookupQueries.bikes(query));
  return (
    <div className="space-y-3">
      <SearchInput label="Search bikes" showLabel value={q} onValueChange={setQ} placeholder="Make, model, VIN or owner" autoFocus />
      {bikes.isLoading ? (
        <LoadingState compact message="Looking up bikes…" />
      ) : bikes.isError ? (
        <ErrorState error={bikes.error} onRetry={() => bikes.refetch()} />
      ) : bikes.data && bikes.data.length === 0 ? (
        <p className="py-4 text-ink-muted">{query ? `No bike matches “${query}”.` : 'No bikes in the shop yet. The front desk adds them with the customer.'}</p>
      ) : (
        <ul aria-label="Bikes" className="divide-y divide-line rounded-card border border-line">
          {bikes.data?.map((b) => (
            <li key={b.id} className="flex items-center justify-between gap-3 px-3 py-2">
              <div className="min-w-0">
                <div className="truncate font-medium text-ink">{bikeLabel(b)}</div>
                <div className="truncate text-sm text-ink-muted">
                  {b.customerName}
                  {b.vin ? ` · ${b.vin}` : ''}
                </div>
              </div>
              <Button size="sm" onClick={() => onPick(b)} aria-label={`Choose ${bikeLabel(b)} (${b.customerName})`}>
                Choose
              </Button>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
