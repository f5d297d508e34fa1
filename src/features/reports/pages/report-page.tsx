import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { Button, Card, Caution, ErrorState, LoadingState, PageHeader, buttonBaseClass, buttonSizeClass, buttonVariantClass, cn } from '@/components/ui';
import { paths } from '@/config/paths';
import { hasRole, useAuth } from '@/lib/auth';
import { formatDate, formatDateTime } from '@shared/format';
import { reportQueries } from '../api/report-queries';
import { ReportRunsCard } from '../components/report-runs';
import { ReportCharts } from '../components/report-charts';
import { HeadlineFigures } from '../components/gain-figures';
import { SendReportDialog } from '../components/send-dialog';
import { SharePanel } from '../components/share-panel';
import { DeliveryLog } from '../components/delivery-log';
import { displayUnits, powerGain, type DisplayUnits } from '@shared/units-display';
import { costCoverage, type ReportCost } from '@shared/schemas/report';
import { formatMoney } from '@shared/format';
import { usePageTitle } from '@/lib/page-title';

const linkButton = (variant: 'primary' | 'secondary') => cn(buttonBaseClass, buttonSizeClass.md, buttonVariantClass[variant]);

/** The report's cost per hp with what it counts, as the PDF prints it. */
function CostLine({ cost, units }: { cost: ReportCost; units: DisplayUnits }) {
  const gain = units.p(cost.gainHp);
  return (
    <p className="num max-w-prose text-sm text-ink-muted" data-testid="report-cost">
      Cost of the work counted <strong className="text-ink">{formatMoney(cost.totalCostCents, { minorUnits: true })}</strong> ÷ peak power gain {powerGain(units, cost.gainHp)} ={' '}
      <strong className="text-ink">{gain > 0 ? `${formatMoney(cost.totalCostCents / 100 / gain, { wholeUnits: true })} per ${units.power}` : 'not meaningful (no peak gain)'}</strong>. Counts {costCoverage(cost)}.
    </p>
  );
}

export default function ReportPage() {
  const { reportId = '' } = useParams();
  const [search, setSearch] = useSearchParams();
  const q = useQuery(reportQueries.detail(reportId));
  usePageTitle(q.data ? `Gain report ${q.data.number}` : 'Gain report');
  const { user } = useAuth();
  const staff = hasRole(user, ['owner', 'tuner', 'desk']);
  const [sendOpen, setSendOpen] = useState(search.get('action') === 'send');
  const [sentLink, setSentLink] = useState<string | null>(null);

  if (q.isPending) return <LoadingState message="Loading the report…" />;
  if (q.isError) return <ErrorState error={q.error} onRetry={() => void q.refetch()} title="This report could not be loaded" />;
  const r = q.data;
  const units = displayUnits(r.data.units);
  const head = r.data.gains[r.data.gains.length - 1];
  const headRun = head ? r.data.runs.find((x) => x.id === head.runId) : undefined;
  const closeSend = () => {
    setSendOpen(false);
    if (search.get('action')) setSearch({}, { replace: true });
  };

  return (
    <div className="space-y-6">
      <PageHeader
        title={`Gain report ${r.number}`}
        subtitle={
          <span>
            Version {r.version} · <span className="num">{formatDate(r.createdAt)}</span> · {r.bikeLabel} · {r.customer.name}
          </span>
        }
        back={
          <Link to={paths.bike(r.bikeId)} className="text-sm text-ink-muted hover:underline">
            Back to the bike
          </Link>
        }
        action={staff ? <Button variant="primary" onClick={() => setSendOpen(true)}>Send to customer</Button> : undefined}
        secondaryActions={
          <a className={linkButton('secondary')} href={`${r.pdfUrl}?download=1`} download>
            Download PDF
          </a>
        }
      />

      {head ? <HeadlineFigures gain={head} run={headRun} units={units} /> : null}
      <p className="max-w-prose text-base leading-relaxed">{r.data.summary}</p>
      {r.data.cost ? <CostLine cost={r.data.cost} units={units} /> : null}
      {r.data.warnings.length ? (
        <Caution title="Read with care" kind="notice">
          <ul className="m-0 list-disc pl-5">
            {r.data.warnings.map((w) => (
              <li key={w}>{w}</li>
            ))}
          </ul>
        </Caution>
      ) : null}

      <div className="grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <Card title="The PDF" description="Exactly what the customer receives; stored unchanged." flush>
          <object data={r.pdfUrl} type="application/pdf" className="block h-[70vh] min-h-[480px] w-full rounded-b-card" aria-label={`PDF of report ${r.number} version ${r.version}`}>
            <div className="p-4 text-sm">
              This browser does not show PDFs inline.{' '}
              <a href={`${r.pdfUrl}?download=1`} className="text-accent underline">
                Download the PDF
              </a>
              .
            </div>
          </object>
        </Card>
        <div className="space-y-6">
          <Card title="Versions">
            <ul className="m-0 list-none divide-y divide-line p-0">
              {r.versions.map((v) => (
                <li key={v.id} className="flex items-center justify-between gap-2 py-2 text-sm">
                  {v.id === r.id ? (
                    <span className="font-semibold" aria-current="page">
                      Version {v.version} (shown)
                    </span>
                  ) : (
                    <Link to={paths.report(v.id)} className="text-accent underline-offset-2 hover:underline">
                      Version {v.version}
                    </Link>
                  )}
                  <span className="num text-ink-subtle">{formatDateTime(v.createdAt)}</span>
                  <a href={`${v.pdfUrl}?download=1`} download className="text-accent underline-offset-2 hover:underline">
                    PDF<span className="sr-only"> version {v.version}</span>
                  </a>
                </li>
              ))}
            </ul>
            <p className="mt-2 text-sm text-ink-subtle">
              To change figures or the note, make a new version from the{' '}
              <Link to={paths.comparison(r.comparisonId)} className="text-accent underline">
                comparison
              </Link>
              .
            </p>
          </Card>
          {staff ? <SharePanel reportId={r.id} canManage sentLink={sentLink} /> : null}
          {staff ? <DeliveryLog reportId={r.id} /> : null}
        </div>
      </div>

      <Card title="Chart">
        <ReportCharts runs={r.data.runs} curves={r.data.curves} gains={r.data.gains} units={units} summary={r.data.summary} />
      </Card>
      <ReportRunsCard runs={r.data.runs} units={units} />
      {staff ? <SendReportDialog key={String(sendOpen)} report={r} open={sendOpen} onClose={closeSend} onSent={setSentLink} /> : null}
    </div>
  );
}
