import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RunReprocessDto } from '@shared/schemas/run';
import { api } from '@/lib/api-client';
import { invalidateKeys } from '@/lib/invalidate';
import { runViews } from '../run-views';

/** A run read again from its stored file may change status and figures: every run view changes. */
export const reprocessRunInvalidates = runViews;

/** Read a kept run file again (POST /api/runs/:id/reprocess), e.g. after a reader fix. */
export function useReprocessRun() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.post<RunReprocessDto>(`/api/runs/${id}/reprocess`),
    onSuccess: () => invalidateKeys(qc, reprocessRunInvalidates()),
  });
}
