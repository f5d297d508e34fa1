import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { invalidateKeys } from '@/lib/invalidate';
import { reportKeys } from '@/lib/query-keys';
import type { ShareLinkView } from './types';

/** The report's share links. */
export const createShareInvalidates = (reportId: string) => [reportKeys.shares(reportId)];

export function useCreateShare(reportId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: { expiresInDays: number }) => api.post<ShareLinkView & { url: string }>(`/api/reports/${reportId}/share`, input),
    onSuccess: () => invalidateKeys(qc, createShareInvalidates(reportId)),
  });
}
