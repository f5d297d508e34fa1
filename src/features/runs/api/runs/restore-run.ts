import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { runQueries } from './run-queries';
import { stageQueries } from '../stages/stage-queries';
import { sessionQueries } from '../sessions/session-queries';

/** Bring back a soft-deleted run. */
export function useRestoreRun() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.post<unknown>(`/api/runs/${id}/restore`),
    onSuccess: () =>
      Promise.all([
        qc.invalidateQueries({ queryKey: runQueries.all() }),
        qc.invalidateQueries({ queryKey: stageQueries.all() }),
        qc.invalidateQueries({ queryKey: sessionQueries.all() }),
      ]),
  });
}
