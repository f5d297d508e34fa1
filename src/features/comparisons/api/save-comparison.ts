import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ComparisonDto, ComparisonInput } from '@shared/schemas/comparison';
import { api } from '@/lib/api-client';
import { comparisonQueries } from './comparison-queries';

/** Saves a comparison (validated with `comparisonInput`); comparison lists refetch. */
export function useSaveComparison() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (data: ComparisonInput) => api.post<ComparisonDto>('/api/comparisons', data),
    onSuccess: () => qc.invalidateQueries({ queryKey: comparisonQueries.lists() }),
  });
}
