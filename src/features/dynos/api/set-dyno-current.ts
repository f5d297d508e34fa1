import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { DynoCurrentDto, dynoCurrentInput } from '@shared/schemas/bay';
import { SAFETY_CHECKS } from '@shared/schemas/run';
import { api } from '@/lib/api-client';
import { dynoKeys, sessionKeys } from '@/lib/query-keys';

export type DynoCurrentInput = z.input<typeof dynoCurrentInput>;

/** Put a bike (and optionally its session and stage) on a dyno; may start today's session. */
export function useSetDynoCurrent(dynoId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: DynoCurrentInput) => api.put<DynoCurrentDto>(`/api/dynos/${dynoId}/current`, input),
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: dynoKeys.board(dynoId) }), qc.invalidateQueries({ queryKey: sessionKeys.all() })]),
  });
}

/** Nothing on the dyno: its agent's files wait in the inbox. */
export function useClearDynoCurrent(dynoId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api.delete<void>(`/api/dynos/${dynoId}/current`),
    onSuccess: () => qc.invalidateQueries({ queryKey: dynoKeys.board(dynoId) }),
  });
}

/** Confirm the bay checklist of the session on the dyno (every check, as listed on the board). */
export function useConfirmBaySafety(dynoId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (sessionId: string) => api.post<unknown>(`/api/sessions/${sessionId}/safety-check`, { checks: SAFETY_CHECKS.map((c) => c.id) }),
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: dynoKeys.board(dynoId) }), qc.invalidateQueries({ queryKey: sessionKeys.all() })]),
  });
}
