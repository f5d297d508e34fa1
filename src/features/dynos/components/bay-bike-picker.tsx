import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { bikeLabel } from '@shared/labels';
import { Button, ErrorState, SearchInput, Spinner, useDebouncedValue, useToast } from '@/components/ui';
import { bayQueries } from '../api/bay-queries';
import { useSetDynoCurrent } from '../api/set-dyno-current';

/**
 * Nothing on the dyno: the newest bikes (or a search) as big buttons; one tap puts that bike on
 * the dyno with today's session.
 */
export function BayBikePicker({ dynoId, canSet }: { dynoId: string; canSet: boolean }) {
  const [q, setQ] = useState('');
  const debounced = useDebouncedValue(q, 250);
  const bikes = useQuery({ ...bayQueries.bikeOptions(debounced), enabled: canSet });
  const set = useSetDynoCurrent(dynoId);
  const toast = useToast();
  if (!canSet) return <p className="text-lg text-ink-muted">A tuner or the owner puts a bike on the dyno.</p>;
  return (
    <div className="space-y-4">
      <SearchInput label="Find a bike" showLabel value={q} onValueChange={setQ} placeholder="Make, model, VIN or customer" />
      {bikes.isError ? (
        <ErrorState error={bikes.error} onRetry={() => bikes.refetch()} isRetrying={bikes.isFetching} />
      ) : bikes.isPending ? (
        <Spinner />
      ) : bikes.data.length === 0 ? (
        <p className="text-lg text-ink-muted">No bike matches “{debounced}”.</p>
      ) : (
        <ul className="grid gap-3 sm:grid-cols-2" aria-label="Bikes to put on the dyno">
          {bikes.data.map((b) => (
            <li key={b.id}>
              <Button
                size="lg"
                fullWidth
                className="h-auto min-h-16 justify-start py-3 text-left text-xl"
                loading={set.isPending && set.variables?.bikeId === b.id}
                onClick={() => set.mutate({ bikeId: b.id }, { onError: (e) => toast.error('The bike was not put on the dyno', { description: e.message }) })}
              >
                <span className="block">
                  <span className="block font-semibold">Put on: {bikeLabel(b)}</span>
                  <span className="block text-base text-ink-muted">{b.customerName}</span>
                </span>
              </Button>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
