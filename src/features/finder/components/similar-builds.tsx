import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { Card, EmptyState, ErrorState, LoadingState } from '@/components/ui';
import { paths } from '@/config/paths';
import { formatGain, formatMoney, formatNumber } from '@shared/format';
import { finderQueries } from '../api/finder-queries';
import { formatDisplacement } from './format-build';

export interface SimilarBuildsProps {
  bikeId: string;
  /** How many to show; default 8. */
  limit?: number;
}

/** Other builds of the shop most like this bike, with why each matched. For the bike page. */
export function SimilarBuilds({ bikeId, limit = 8 }: SimilarBuildsProps) {
  const query = useQuery(finderQueries.similar(bikeId));
  return (
    <Card title="Similar builds" description="Ranked by engine family, displacement, and the parts fitted.">
      {query.isPending ? (
        <LoadingState compact message="Finding similar builds…" />
      ) : query.isError ? (
        <ErrorState error={query.error} onRetry={() => query.refetch()} isRetrying={query.isFetching} />
      ) : query.data.items.length === 0 ? (
        <EmptyState title="No similar builds yet" message="Builds appear here once other bikes like this one have measured stages." />
      ) : (
        <ol className="grid gap-3">
          {query.data.items.slice(0, limit).map((b) => (
            <li key={b.stageId} className="grid gap-1 rounded-control border border-line p-3 md:grid-cols-[1fr_auto] md:items-center">
              <div className="grid gap-1">
                <Link to={paths.bike(b.bikeId)} className="font-semibold text-accent underline-offset-2 hover:underline">
                  {b.make} {b.model} — {b.stageName}
                </Link>
                <p className="text-sm text-ink-muted">
                  {b.engineFamily ?? 'Engine not recorded'} · {formatDisplacement(b.displacementCc)}
                </p>
                <ul className="flex flex-wrap gap-1 text-xs text-ink-muted" aria-label="Why it matched">
                  {b.reasons.map((r) => (
                    <li key={r} className="rounded-full border border-line px-2 py-0.5">
                      {r}
                    </li>
                  ))}
                </ul>
              </div>
              <dl className="num grid grid-cols-3 gap-3 text-right text-sm md:min-w-72">
                <div>
                  <dt className="text-ink-muted">Peak gain</dt>
                  <dd className="font-semibold text-ink">{formatGain(b.peakPowerGainHp)}</dd>
                </div>
                <div>
                  <dt className="text-ink-muted">Build cost</dt>
                  <dd className="text-ink">{formatMoney(b.cumulativeCostCents, { minorUnits: true, wholeUnits: true })}</dd>
                </div>
                <div>
                  <dt className="text-ink-muted">Match</dt>
                  <dd className="text-ink">{formatNumber(b.similarity * 100)} %</dd>
                </div>
              </dl>
            </li>
          ))}
        </ol>
      )}
    </Card>
  );
}
