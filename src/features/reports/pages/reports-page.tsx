import { useQuery } from '@tanstack/react-query';
import { Card, EmptyState, ErrorState, LoadingState, PageHeader } from '@/components/ui';
import { reportQueries } from '../api/report-queries';
import { ReportList } from '../components/report-list';
import { usePageTitle } from '@/lib/page-title';

/** Every report of the shop (customers: their own), newest first. */
export default function ReportsPage() {
  const q = useQuery(reportQueries.list());
  usePageTitle('Gain reports');
  return (
    <div className="space-y-6">
      <PageHeader title="Gain reports" subtitle="Every version the shop generated, newest first." />
      <Card flush={false}>
        {q.isPending ? (
          <LoadingState compact message="Loading reports…" />
        ) : q.isError ? (
          <ErrorState error={q.error} onRetry={() => void q.refetch()} />
        ) : q.data.length === 0 ? (
          <EmptyState icon="file" title="No reports yet" message="Make one from a saved comparison." />
        ) : (
          <ReportList reports={q.data} showBike />
        )}
      </Card>
    </div>
  );
}
