import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { stageQueries } from './stage-queries';
import { runQueries } from '../runs/run-queries';

export function useDeleteStage() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.delete<unknown>(`/api/stages/${id}`),
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: stageQueries.all() }), qc.invalidateQueries({ queryKey: runQueries.all() })]),
  });
}
