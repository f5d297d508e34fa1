import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { reportKeys } from '@/lib/query-keys';
import type { Delivery, ShareLinkView } from './types';

export function useCreateReport() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: { comparisonId: string; technicianNote?: string | null }) => api.post<{ id: string; number: string; version: number; pdfUrl: string }>('/api/reports', input),
    onSuccess: () => qc.invalidateQueries({ queryKey: reportKeys.all() }),
  });
}

export function useSendReport(reportId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: { to: string; message: string }) => api.post<Delivery & { shareUrl: string }>(`/api/reports/${reportId}/send`, input),
    onSettled: () => qc.invalidateQueries({ queryKey: reportKeys.all() }),
  });
}

export function useCreateShare(reportId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: { expiresInDays: number }) => api.post<ShareLinkView & { url: string }>(`/api/reports/${reportId}/share`, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: reportKeys.shares(reportId) }),
  });
}

export function useRevokeShare(reportId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (shareId: string) => api.delete<ShareLinkView>(`/api/reports/${reportId}/share/${shareId}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: reportKeys.shares(reportId) }),
  });
}
