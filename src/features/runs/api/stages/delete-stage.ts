import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { invalidateKeys } from '@/lib/invalidate';
import { runViews } from '../run-views';

/** Its runs lose their stage: every run view changes. */
export const deleteStageInvalidates = runViews;

export function useDeleteStage() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.delete<unknown>(`/api/stages/${id}`),
    onSuccess: () => invalidateKeys(qc, deleteStageInvalidates()),
  });
}
