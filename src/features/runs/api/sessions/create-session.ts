import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { SessionDto, sessionInput } from '@shared/schemas/run';
import { api } from '@/lib/api-client';
import { invalidateKeys } from '@/lib/invalidate';
import { sessionKeys } from '@/lib/query-keys';

export type SessionInput = z.input<typeof sessionInput>;

/** A new session shows in the bike's session list (its detail is written from the answer). */
export const createSessionInvalidates = (bikeId: string) => [sessionKeys.list(bikeId)];

export function useCreateSession() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: SessionInput) => api.post<SessionDto>('/api/sessions', body),
    onSuccess: (session) => {
      qc.setQueryData(sessionKeys.detail(session.id), session);
      return invalidateKeys(qc, createSessionInvalidates(session.bikeId));
    },
  });
}
