import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { invalidateKeys } from '@/lib/invalidate';
import { reportKeys } from '@/lib/query-keys';
import type { ShareLinkView } from './types';

/** The report's share links. */
export const revokeShareInvalidates = (reportId: string) => [reportKeys.shares(reportId)];

export function useRevokeShare(reportId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (shareId: string) => api.delete<ShareLinkView>(`/api/reports/${reportId}/share/${shareId}`),
    onSuccess: () => invalidateKeys(qc, revokeShareInvalidates(reportId)),
  });
}
