import { useQuery } from '@tanstack/react-query';
import { useParams } from 'react-router-dom';
import { Caution, LoadingState, buttonBaseClass, buttonSizeClass, buttonVariantClass, cn } from '@/components/ui';
import { ApiError } from '@/lib/api-client';
import { formatDate } from '@shared/format';
import { reportQueries } from '../api/report-queries';
import { ReportCharts } from '../components/report-charts';
import { HeadlineFigures } from '../components/gain-figures';
import { ReportRunsCard } from '../components/report-runs';
import { displayUnits } from '@shared/units-display';
import { usePageTitle } from '@/lib/page-title';

function NotValid({ rateLimited }: { rateLimited: boolean }) {
  return (
    <main className="mx-auto flex min-h-screen max-w-lg flex-col justify-center px-6 py-12">
      <h1 className="text-2xl font-semibold">{rateLimited ? 'Too many requests' : 'This link is not valid'}</h1>
      <p className="mt-3 text-ink-muted">
        {rateLimited
          ? 'Please wait a minute and open the link again.'
          : 'It may have expired or been withdrawn by the shop. Ask the shop that sent it for a new link.'}
      </p>
    </main>
  );
}

/** The public page of a share link: that report's figures, chart and PDF, and the shop's name. */
export default function SharePage() {
  const { token = '' } = useParams();
  const q = useQuery(reportQueries.publicShare(token));
  usePageTitle('Gain report', q.data?.shopName ?? null);
  if (q.isPending) return <LoadingState message="Loading the report…" />;
  if (q.isError) return <NotValid rateLimited={q.error instanceof ApiError && q.error.status === 429} />;
  const s = q.data;
  const units = displayUnits(s.units);
  const head = s.gains[s.gains.length - 1];
  const headRun = head ? s.runs.find((r) => r.id === head.runId) : undefined;
  return (
    <main className="mx-auto max-w-5xl space-y-6 px-4 py-8 md:px-8">
      <header className="flex flex-wrap items-end justify-between gap-4 border-b border-line pb-4">
        <div>
          <p className="m-0 text-sm font-medium uppercase tracking-wide text-ink-subtle">{s.shopName}</p>
          <h1 className="m-0 text-3xl font-semibold">Gain report · {s.bikeLabel}</h1>
          <p className="m-0 text-ink-muted">
            <span className="num">
              {s.number} · version {s.version} · {formatDate(s.createdAt)}
            </span>
          </p>
        </div>
        <a className={cn(buttonBaseClass, buttonSizeClass.lg, buttonVariantClass.primary)} href={s.pdfUrl} download>
          Download the PDF
        </a>
      </header>
      {head ? <HeadlineFigures gain={head} run={headRun} units={units} /> : null}
      <p className="max-w-prose text-lg leading-relaxed">{s.summary}</p>
      {s.warnings.length ? (
        <Caution title="Read with care" kind="notice">
          <ul className="m-0 list-disc pl-5" aria-label="Warnings about these figures">
            {s.warnings.map((w) => (
              <li key={w}>{w}</li>
            ))}
          </ul>
        </Caution>
      ) : null}
      <section aria-labelledby="chart-title" className="rounded-card border border-line bg-paper-raised p-4">
        <h2 id="chart-title" className="mt-0 text-lg font-semibold">
          Charts
        </h2>
        <ReportCharts runs={s.runs} curves={s.curves} gains={s.gains} units={units} summary={s.summary} />
      </section>
      <ReportRunsCard runs={s.runs} units={units} />
      <Caution title="Reading these figures">
        Dyno figures depend on the dyno, the correction standard and the conditions on the day; compare only like with like. Modifications may affect emissions compliance, noise limits, warranty and insurance, and on-road use is governed by local law. The PDF has the full details.
      </Caution>
      <p className="text-sm text-ink-subtle">This link works until {formatDate(s.expiresAt)}.</p>
    </main>
  );
}
