import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { Card, EmptyState, ErrorState, LoadingState, buttonBaseClass, buttonSizeClass, buttonVariantClass, cn } from '@/components/ui';
import { paths } from '@/config/paths';
import { hasRole, useAuth } from '@/lib/auth';
import { formatDate } from '@shared/format';
import { reportQueries } from '../api/report-queries';

const linkButton = cn(buttonBaseClass, buttonSizeClass.sm, buttonVariantClass.secondary);

/** The bike page's list of gain reports (every version), with send and share shortcuts for staff. */
export function BikeReportsSection({ bikeId }: { bikeId: string }) {
  const q = useQuery(reportQueries.list({ bikeId }));
  const { user } = useAuth();
  const staff = hasRole(user, ['owner', 'tuner', 'desk']);
  return (
    <Card title="Gain reports" description="Each generated report is kept unchanged; making it again adds a new version.">
      {q.isPending ? (
        <LoadingState compact message="Loading reports…" />
      ) : q.isError ? (
        <ErrorState error={q.error} onRetry={() => void q.refetch()} />
      ) : q.data.length === 0 ? (
        <EmptyState icon="file" title="No reports yet" message={staff ? 'Open a comparison of this bike and choose “Make gain report”.' : 'The shop has not made a report for this bike yet.'} />
      ) : (
        <ul className="m-0 list-none divide-y divide-line p-0">
          {q.data.map((r) => (
            <li key={r.id} className="flex flex-wrap items-center justify-between gap-3 py-3">
              <div className="min-w-0">
                <Link to={paths.report(r.id)} className="font-medium text-ink underline-offset-2 hover:underline">
                  {r.number} · version {r.version}
                </Link>
                <div className="text-sm text-ink-subtle">
                  <span className="num">{formatDate(r.createdAt)}</span>
                  {r.headline ? <span className="num"> · {r.headline.peakPowerGain} at peak, area {r.headline.areaGain}</span> : null}
                </div>
              </div>
              <div className="flex flex-wrap gap-2">
                <a className={linkButton} href={`${r.pdfUrl}?download=1`} download>
                  PDF<span className="sr-only"> of {r.number} version {r.version}</span>
                </a>
                {staff ? (
                  <>
                    <Link className={linkButton} to={`${paths.report(r.id)}?action=send`}>
                      Send<span className="sr-only"> {r.number} version {r.version}</span>
                    </Link>
                    <Link className={linkButton} to={`${paths.report(r.id)}?action=share`}>
                      Share<span className="sr-only"> {r.number} version {r.version}</span>
                    </Link>
                  </>
                ) : null}
              </div>
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}
