import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { invalidateKeys } from '@/lib/invalidate';
import { runViews } from '../run-views';

/** A deleted run leaves every run view (lists, stage and session counts, gains, candidates). */
export const deleteRunInvalidates = runViews;

export function deleteRunMutation(qc: QueryClient) {
  return {
    mutationFn: (id: string) => api.delete<unknown>(`/api/runs/${id}`),
    onSuccess: () => invalidateKeys(qc, deleteRunInvalidates()),
  };
}

/** Soft delete (the owner can restore it). */
export function useDeleteRun() {
  return useMutation(deleteRunMutation(useQueryClient()));
}
