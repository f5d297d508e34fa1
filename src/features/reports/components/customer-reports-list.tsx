import { useQuery } from '@tanstack/react-query';
import { Card, EmptyState, ErrorState, LoadingState } from '@/components/ui';
import { reportQueries } from '../api/report-queries';
import { ReportList } from './report-list';

/** The signed-in customer's reports across their bikes (the server scopes them to the customer). */
export function CustomerReportsList() {
  const q = useQuery(reportQueries.list());
  return (
    <Card title="Your gain reports">
      {q.isPending ? (
        <LoadingState compact message="Loading your reports…" />
      ) : q.isError ? (
        <ErrorState error={q.error} onRetry={() => void q.refetch()} />
      ) : q.data.length === 0 ? (
        <EmptyState icon="file" title="No reports yet" message="When the shop finishes a dyno report for your bike, it appears here." />
      ) : (
        <ReportList reports={q.data} showBike />
      )}
    </Card>
  );
}
