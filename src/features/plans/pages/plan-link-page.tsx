import { useQuery } from '@tanstack/react-query';
import { useParams, useSearchParams } from 'react-router-dom';
import { LoadingState } from '@/components/ui';
import { ApiError } from '@/lib/api-client';
import { usePageTitle } from '@/lib/page-title';
import { planQueries } from '../api/plan-queries';
import { CustomerResponse } from '../components/customer-response';
import { PlanFacts, PlanItems, PlanPrediction } from '../components/plan-details';
import { PlanStatusBadge } from '../components/plan-status';

/** A plan opened from the link in the e-mail, without an account: review, accept or decline, pay the deposit. */
export default function PlanLinkPage() {
  const { token = '' } = useParams();
  const [search] = useSearchParams();
  const q = useQuery(planQueries.link(token));
  usePageTitle('Build plan', q.data?.shopName ?? null);
  if (q.isPending) return <LoadingState message="Loading the plan…" />;
  if (q.isError) {
    const limited = q.error instanceof ApiError && q.error.status === 429;
    return (
      <main className="mx-auto flex min-h-screen max-w-lg flex-col justify-center px-6 py-12">
        <h1 className="text-2xl font-semibold">{limited ? 'Too many requests' : 'This link is not valid'}</h1>
        <p className="mt-3 text-ink-muted">{limited ? 'Please wait a minute and open the link again.' : 'The shop may have sent a newer version of the plan. Ask the shop that sent it for the latest link.'}</p>
      </main>
    );
  }
  const { plan, shopName, pdfUrl } = q.data;
  return (
    <main className="mx-auto max-w-5xl space-y-6 px-4 py-8 md:px-8">
      <header className="flex flex-wrap items-end justify-between gap-4 border-b border-line pb-4">
        <div>
          <p className="m-0 text-sm font-medium uppercase tracking-wide text-ink-subtle">{shopName}</p>
          <h1 className="m-0 text-3xl font-semibold">
            {plan.title} · {plan.bikeLabel}
          </h1>
          <p className="m-0 text-ink-muted">Build plan for {plan.customerName}, version {plan.version}</p>
        </div>
        <div className="flex items-center gap-3">
          <PlanStatusBadge status={plan.status} />
          <a className="text-accent underline" href={pdfUrl}>
            Quote PDF
          </a>
        </div>
      </header>
      <PlanFacts plan={plan} />
      <CustomerResponse plan={plan} target={{ token }} paidReturn={search.get('deposit') === 'paid'} />
      <PlanItems plan={plan} />
      <PlanPrediction plan={plan} />
    </main>
  );
}
