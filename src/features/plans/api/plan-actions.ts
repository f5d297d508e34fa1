/**
 * Every action on an existing plan, one hook each: staff (send, revise, convert, refund) and the
 * customer's (accept, decline, pay the deposit) through the portal or the plan link. Each
 * refreshes everything plans show, the bike's stages too after a conversion.
 */
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DepositCheckoutDto, PlanDto, PlanSendDto } from '@shared/schemas/plans';
import { api } from '@/lib/api-client';
import { bikeKeys, planKeys, stageKeys } from '@/lib/query-keys';
import { targetBase, type PlanTarget } from './plan-queries';

function useRefresh() {
  const qc = useQueryClient();
  return () => Promise.all([qc.invalidateQueries({ queryKey: planKeys.all() }), qc.invalidateQueries({ queryKey: stageKeys.all() }), qc.invalidateQueries({ queryKey: bikeKeys.all() })]);
}

export function useSendPlan(planId: string) {
  const refresh = useRefresh();
  return useMutation({ mutationFn: (body: { to?: string; validDays?: number }) => api.post<PlanSendDto>(`/api/plans/${planId}/send`, body), onSuccess: refresh });
}

export function useRevisePlan(planId: string) {
  const refresh = useRefresh();
  return useMutation({ mutationFn: () => api.post<PlanDto>(`/api/plans/${planId}/revise`), onSuccess: refresh });
}

export function useConvertPlan(planId: string) {
  const refresh = useRefresh();
  return useMutation({ mutationFn: (body: { name?: string }) => api.post<PlanDto>(`/api/plans/${planId}/convert`, body), onSuccess: refresh });
}

export function useRefundDeposit(planId: string) {
  const refresh = useRefresh();
  return useMutation({ mutationFn: (body: { reason?: string }) => api.post<PlanDto>(`/api/plans/${planId}/refund`, body), onSuccess: refresh });
}

export function useAcceptPlan(target: PlanTarget) {
  const refresh = useRefresh();
  return useMutation({ mutationFn: (body: { name: string }) => api.post<PlanDto>(`${targetBase(target)}/accept`, body), onSuccess: refresh });
}

export function useDeclinePlan(target: PlanTarget) {
  const refresh = useRefresh();
  return useMutation({ mutationFn: (body: { reason?: string }) => api.post<PlanDto>(`${targetBase(target)}/decline`, body), onSuccess: refresh });
}

/** Starts the hosted checkout and goes there (the provider's page, then back to the plan). */
export function useStartDeposit(target: PlanTarget) {
  return useMutation({
    mutationFn: () => api.post<DepositCheckoutDto>(`${targetBase(target)}/deposit`),
    onSuccess: ({ url }) => window.location.assign(url),
  });
}
