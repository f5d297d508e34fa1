import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SessionDto } from '@shared/schemas/run';
import { api } from '@/lib/api-client';
import { sessionKeys } from '@/lib/query-keys';

/** Record that the dyno-bay checks were done before the session's first pull. */
export function useConfirmSafety() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ sessionId, checks }: { sessionId: string; checks: string[] }) =>
      api.post<SessionDto | undefined>(`/api/sessions/${sessionId}/safety-check`, { checks }),
    onSuccess: async (session, vars) => {
      if (session && typeof session === 'object' && 'id' in session) qc.setQueryData(sessionKeys.detail(vars.sessionId), session);
      await qc.invalidateQueries({ queryKey: sessionKeys.all() });
    },
  });
}
