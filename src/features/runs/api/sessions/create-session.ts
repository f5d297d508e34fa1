import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { SessionDto, sessionInput } from '@shared/schemas/run';
import { api } from '@/lib/api-client';
import { sessionQueries } from './session-queries';

export type SessionInput = z.input<typeof sessionInput>;

export function useCreateSession() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: SessionInput) => api.post<SessionDto>('/api/sessions', body),
    onSuccess: (session) => {
      qc.setQueryData(sessionQueries.detail(session.id).queryKey, session);
      return qc.invalidateQueries({ queryKey: sessionQueries.list(session.bikeId).queryKey });
    },
  });
}
