import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { comparisonQueries } from './comparison-queries';

/** Deletes a saved comparison (owner, tuner); its detail is dropped and lists refetch. */
export function useDeleteComparison() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.delete<void>(`/api/comparisons/${id}`),
    onSuccess: (_r, id) => {
      qc.removeQueries({ queryKey: comparisonQueries.detail(id).queryKey });
      return qc.invalidateQueries({ queryKey: comparisonQueries.lists() });
    },
  });
}
