import { useQuery } from '@tanstack/react-query';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { STAFF } from '@shared/roles';
import { EmptyState, ErrorState, Icon, LoadingState, PageHeader } from '@/components/ui';
import { paths } from '@/config/paths';
import { ApiError } from '@/lib/api-client';
import { hasRole, useCurrentUser } from '@/lib/auth';
import { usePageTitle } from '@/lib/page-title';
import { planQueries } from '../api/plan-queries';
import { CustomerResponse } from '../components/customer-response';
import { PlanFacts, PlanItems, PlanOutcome, PlanPrediction } from '../components/plan-details';
import { PlanStatusBadge } from '../components/plan-status';
import { StaffPlanActions } from '../components/staff-actions';

/** A plan, signed in: staff manage it; the bike's customer reviews, accepts and pays here. */
export default function PlanPage() {
  const { planId = '' } = useParams();
  const [search] = useSearchParams();
  const user = useCurrentUser();
  const staff = hasRole(user, STAFF);
  const q = useQuery(planQueries.detail(planId));
  usePageTitle(q.data?.title ?? 'Build plan');
  if (q.isPending) return <LoadingState message="Loading the plan…" />;
  if (q.isError) {
    if (q.error instanceof ApiError && (q.error.status === 404 || q.error.status === 400)) return <EmptyState title="No such plan" message="This plan is not on file, or it is not one you can see." />;
    return <ErrorState error={q.error} onRetry={() => q.refetch()} isRetrying={q.isFetching} />;
  }
  const plan = q.data;
  return (
    <>
      <PageHeader
        back={
          <Link to={paths.bike(plan.bikeId)} className="focus-ring inline-flex items-center gap-1 rounded-control text-ink-muted hover:text-ink">
            <Icon name="chevron-left" size={16} /> {plan.bikeLabel}
          </Link>
        }
        title={plan.title}
        subtitle={`Build plan for ${plan.customerName}`}
      />
      <div className="space-y-6">
        <div className="flex flex-wrap items-center gap-3">
          <PlanStatusBadge status={plan.status} />
          {plan.version > 0 ? (
            <a className="text-accent underline" href={`/api/plans/${plan.id}/pdf`}>
              Quote PDF (version {plan.version})
            </a>
          ) : null}
        </div>
        <PlanFacts plan={plan} />
        {staff ? <StaffPlanActions plan={plan} /> : <CustomerResponse plan={plan} target={{ planId: plan.id }} paidReturn={search.get('deposit') === 'paid'} />}
        <PlanOutcome plan={plan} />
        <PlanItems plan={plan} />
        <PlanPrediction plan={plan} />
      </div>
    </>
  );
}
