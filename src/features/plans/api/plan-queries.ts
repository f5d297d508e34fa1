import { queryOptions } from '@tanstack/react-query';
import type { Page } from '@shared/schemas/common';
import type { PlanDto, PlanVersionDto, PublicPlanDto } from '@shared/schemas/plans';
import { api } from '@/lib/api-client';
import { planKeys } from '@/lib/query-keys';

export const planQueries = {
  all: planKeys.all,
  bike: (bikeId: string) => queryOptions({ queryKey: planKeys.bike(bikeId), queryFn: async () => (await api.get<Page<PlanDto>>(`/api/bikes/${bikeId}/plans`)).items }),
  detail: (id: string) => queryOptions({ queryKey: planKeys.detail(id), queryFn: () => api.get<PlanDto>(`/api/plans/${id}`) }),
  versions: (id: string) => queryOptions({ queryKey: planKeys.versions(id), queryFn: async () => (await api.get<Page<PlanVersionDto>>(`/api/plans/${id}/versions`)).items }),
  link: (token: string) =>
    queryOptions({ queryKey: planKeys.link(token), queryFn: () => api.get<PublicPlanDto>(`/api/plan-links/${encodeURIComponent(token)}`), retry: false }),
};

/** Where a plan's customer actions go: the portal's plan routes, or the plan link's. */
export type PlanTarget = { planId: string } | { token: string };
export const targetBase = (t: PlanTarget) => ('token' in t ? `/api/plan-links/${encodeURIComponent(t.token)}` : `/api/plans/${t.planId}`);
