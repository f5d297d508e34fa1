import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { stageQueries } from './stage-queries';
import { runQueries } from '../runs/run-queries';

/** Make a run the one that represents its stage (gains on the build timeline use it). */
export function useSetReferenceRun() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ stageId, runId }: { stageId: string; runId: string | null }) => api.post<unknown>(`/api/stages/${stageId}/reference-run`, { runId }),
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: stageQueries.all() }), qc.invalidateQueries({ queryKey: runQueries.all() })]),
  });
}
