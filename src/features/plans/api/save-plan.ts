import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { PlanDto, planInput } from '@shared/schemas/plans';
import { api } from '@/lib/api-client';
import { planKeys } from '@/lib/query-keys';

/** Drafts a new plan for a bike, or saves a draft's changes; the bike's list and the plan refresh. */
export function useSavePlan(bikeId: string, planId?: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: z.output<typeof planInput>) => (planId ? api.put<PlanDto>(`/api/plans/${planId}`, body) : api.post<PlanDto>(`/api/bikes/${bikeId}/plans`, body)),
    onSuccess: (plan) => {
      qc.setQueryData(planKeys.detail(plan.id), plan);
      return qc.invalidateQueries({ queryKey: planKeys.bike(bikeId) });
    },
  });
}
