import { Link } from 'react-router-dom';
import { Badge } from '@/components/ui';
import { paths } from '@/config/paths';
import { formatDate, formatFileSize } from '@shared/format';
import type { ReportSummary } from '../api/types';

/** Report versions as a calm list: number, version, date, headline gain, PDF link. */
export function ReportList({ reports, showBike = false }: { reports: ReportSummary[]; showBike?: boolean }) {
  return (
    <ul className="m-0 list-none divide-y divide-line p-0">
      {reports.map((r) => (
        <li key={r.id} className="flex flex-wrap items-center justify-between gap-3 py-3">
          <div className="min-w-0">
            <Link to={paths.report(r.id)} className="font-medium text-ink underline-offset-2 hover:underline">
              {r.number} <span className="text-ink-muted">· version {r.version}</span>
            </Link>
            <div className="text-sm text-ink-subtle">
              <span className="num">{formatDate(r.createdAt)}</span>
              {showBike && r.bikeLabel ? ` · ${r.bikeLabel}` : ''}
              {r.comparisonName ? ` · ${r.comparisonName}` : ''}
            </div>
          </div>
          <div className="flex items-center gap-3">
            {r.headline ? (
              <Badge tone="gain">
                <span className="num">{r.headline.peakPowerGain} peak</span>
              </Badge>
            ) : null}
            <a href={`${r.pdfUrl}?download=1`} className="text-sm font-medium text-accent underline-offset-2 hover:underline" download>
              PDF <span className="sr-only">of {r.number} version {r.version}</span>
              <span className="num text-ink-subtle"> ({formatFileSize(r.pdfSizeBytes)})</span>
            </a>
          </div>
        </li>
      ))}
    </ul>
  );
}
