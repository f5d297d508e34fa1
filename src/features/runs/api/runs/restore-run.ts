import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { invalidateKeys } from '@/lib/invalidate';
import { runViews } from '../run-views';

/** A restored run is back in every run view. */
export const restoreRunInvalidates = runViews;

export function restoreRunMutation(qc: QueryClient) {
  return {
    mutationFn: (id: string) => api.post<unknown>(`/api/runs/${id}/restore`),
    onSuccess: () => invalidateKeys(qc, restoreRunInvalidates()),
  };
}

/** Bring back a soft-deleted run. */
export function useRestoreRun() {
  return useMutation(restoreRunMutation(useQueryClient()));
}
