import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link, useNavigate } from 'react-router-dom';
import { formatDate } from '@shared/format';
import { Button, Card, EmptyState, ErrorState, LoadingState } from '@/components/ui';
import { paths } from '@/config/paths';
import { hasRole, useCurrentUser } from '@/lib/auth';
import { planQueries } from '../api/plan-queries';
import { PlanEditor } from './plan-editor';
import { PlanStatusBadge } from './plan-status';
import { money } from './plan-details';

/** The bike page's build plans: status, total and deposit at a glance; staff draft new ones here. */
export function BikePlansSection({ bikeId }: { bikeId: string }) {
  const user = useCurrentUser();
  const staff = hasRole(user, ['owner', 'tuner', 'desk']);
  const q = useQuery(planQueries.bike(bikeId));
  const [drafting, setDrafting] = useState(false);
  const navigate = useNavigate();
  return (
    <Card
      title="Build plans"
      description="Priced offers for the next stage, with what similar builds added."
      actions={staff ? <Button onClick={() => setDrafting(true)}>New plan</Button> : undefined}
    >
      {q.isPending ? (
        <LoadingState compact message="Loading plans…" />
      ) : q.isError ? (
        <ErrorState error={q.error} onRetry={() => void q.refetch()} />
      ) : q.data.length === 0 ? (
        <EmptyState icon="file" title="No plans yet" message={staff ? 'Draft a plan to quote the next stage with the archive’s expected gain.' : 'The shop has not sent you a plan for this bike.'} />
      ) : (
        <ul className="m-0 list-none divide-y divide-line p-0">
          {q.data.map((p) => (
            <li key={p.id} className="flex flex-wrap items-center justify-between gap-3 py-3">
              <div className="min-w-0">
                <Link to={paths.plan(p.id)} className="font-medium text-ink underline-offset-2 hover:underline">
                  {p.title}
                </Link>
                <div className="num text-sm text-ink-subtle">
                  {money(p, p.totalCostCents)}
                  {p.version ? ` · version ${p.version}` : ''} · {formatDate(p.updatedAt)}
                  {p.depositCents ? ` · deposit ${money(p, p.depositPaidCents)} of ${money(p, p.depositCents)} paid` : ''}
                </div>
              </div>
              <PlanStatusBadge status={p.status} />
            </li>
          ))}
        </ul>
      )}
      {staff && <PlanEditor open={drafting} onClose={() => setDrafting(false)} bikeId={bikeId} onSaved={(p) => navigate(paths.plan(p.id))} />}
    </Card>
  );
}
