import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { invalidateKeys } from '@/lib/invalidate';
import { runViews } from '../run-views';

/** The reference run sets the stage's figures: gains by stage, candidates, finder and run pages change. */
export const setReferenceRunInvalidates = runViews;

export function setReferenceRunMutation(qc: QueryClient) {
  return {
    mutationFn: ({ stageId, runId }: { stageId: string; runId: string | null }) => api.post<unknown>(`/api/stages/${stageId}/reference-run`, { runId }),
    onSuccess: () => invalidateKeys(qc, setReferenceRunInvalidates()),
  };
}

/** Make a run the one that represents its stage (gains on the build timeline use it). */
export function useSetReferenceRun() {
  return useMutation(setReferenceRunMutation(useQueryClient()));
}
