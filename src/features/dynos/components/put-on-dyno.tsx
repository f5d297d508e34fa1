import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { WORKSHOP } from '@shared/roles';
import { Button, useToast } from '@/components/ui';
import { hasRole, useCurrentUser } from '@/lib/auth';
import { paths } from '@/config/paths';
import { dynoQueries } from '../api/dyno-queries';
import { useSetDynoCurrent } from '../api/set-dyno-current';

/**
 * "Put on dyno" for the bike page: one tap with one dyno, a choice of dyno with several. Files from
 * that dyno's PC then land in this bike's session of today. Tuners and the owner only.
 */
export function PutOnDyno({ bikeId }: { bikeId: string }) {
  const user = useCurrentUser();
  const allowed = hasRole(user, WORKSHOP);
  const dynos = useQuery({ ...dynoQueries.list(), enabled: allowed });
  const [dynoId, setDynoId] = useState('');
  const chosen = dynoId || (dynos.data?.length === 1 ? dynos.data[0].id : '');
  const set = useSetDynoCurrent(chosen);
  const toast = useToast();
  const [done, setDone] = useState<string | null>(null);
  if (!allowed || !dynos.data?.length) return null;
  const name = dynos.data.find((d) => d.id === chosen)?.name ?? 'the dyno';
  return (
    <div className="flex flex-wrap items-center gap-2">
      {dynos.data.length > 1 && (
        <select aria-label="Dyno" className="min-h-10 rounded-control border border-line bg-paper-raised px-2" value={dynoId} onChange={(e) => setDynoId(e.target.value)}>
          <option value="">Choose a dyno…</option>
          {dynos.data.map((d) => (
            <option key={d.id} value={d.id}>
              {d.name}
            </option>
          ))}
        </select>
      )}
      <Button
        disabled={!chosen}
        loading={set.isPending}
        onClick={() =>
          set.mutate(
            { bikeId },
            {
              onSuccess: () => {
                setDone(chosen);
                toast.success(`On ${name} now: its files land in today’s session of this bike`);
              },
              onError: (e) => toast.error('The bike was not put on the dyno', { description: e.message }),
            },
          )
        }
      >
        Put on dyno
      </Button>
      {done && (
        <Link className="text-accent underline" to={paths.bayBoard(done)}>
          Bay board
        </Link>
      )}
    </div>
  );
}
