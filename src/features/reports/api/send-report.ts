import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { invalidateKeys } from '@/lib/invalidate';
import { reportKeys } from '@/lib/query-keys';
import type { Delivery } from './types';

/** A send (or a failed attempt) adds a delivery and a share link. */
export const sendReportInvalidates = () => [reportKeys.all()];

export function useSendReport(reportId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: { to: string; message: string }) => api.post<Delivery & { shareUrl: string }>(`/api/reports/${reportId}/send`, input),
    onSettled: () => invalidateKeys(qc, sendReportInvalidates()),
  });
}
