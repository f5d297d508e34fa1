import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { invalidateKeys } from '@/lib/invalidate';
import { reportKeys } from '@/lib/query-keys';
import type { Delivery } from './types';

/** A send (or a failed attempt) adds a delivery and a share link: the report's log and link list. */
export const sendReportInvalidates = (reportId?: string) => (reportId ? [reportKeys.all(), reportKeys.shares(reportId), reportKeys.deliveries(reportId)] : [reportKeys.all()]);

export function useSendReport(reportId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: { to: string; message: string }) => api.post<Delivery & { shareUrl: string }>(`/api/reports/${reportId}/send`, input),
    onSettled: () => invalidateKeys(qc, sendReportInvalidates(reportId)),
  });
}
