import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { runQueries } from './run-queries';
import { stageQueries } from '../stages/stage-queries';
import { sessionQueries } from '../sessions/session-queries';

/** Soft delete (the owner can restore it); lists, stages and sessions count runs, so all refetch. */
export function useDeleteRun() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.delete<unknown>(`/api/runs/${id}`),
    onSuccess: () =>
      Promise.all([
        qc.invalidateQueries({ queryKey: runQueries.all() }),
        qc.invalidateQueries({ queryKey: stageQueries.all() }),
        qc.invalidateQueries({ queryKey: sessionQueries.all() }),
      ]),
  });
}
