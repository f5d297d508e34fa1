import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SessionDto } from '@shared/schemas/run';
import { api } from '@/lib/api-client';
import { sessionQueries } from './session-queries';

/** Record that the dyno-bay checks were done before the session's first pull. */
export function useConfirmSafety() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ sessionId, checks }: { sessionId: string; checks: string[] }) =>
      api.post<SessionDto | undefined>(`/api/sessions/${sessionId}/safety-check`, { checks }),
    onSuccess: async (session, vars) => {
      if (session && typeof session === 'object' && 'id' in session) qc.setQueryData(sessionQueries.detail(vars.sessionId).queryKey, session);
      await qc.invalidateQueries({ queryKey: sessionQueries.all() });
    },
  });
}
