import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { invalidateKeys } from '@/lib/invalidate';
import { reportKeys } from '@/lib/query-keys';

/** A new report (or version) shows in every report list. */
export const createReportInvalidates = () => [reportKeys.all()];

export function useCreateReport() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: { comparisonId: string; technicianNote?: string | null }) => api.post<{ id: string; number: string; version: number; pdfUrl: string }>('/api/reports', input),
    onSuccess: () => invalidateKeys(qc, createReportInvalidates()),
  });
}
