import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InviteUserInput } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';
import { outboxKeys } from '@/lib/query-keys';
import { adminQueries, type UserDto } from './admin-queries';

/** Invites a user by e-mail; the list gains a row and the outbox a message. */
export function useInviteUser() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: InviteUserInput) => api.post<UserDto>('/api/users', body),
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: adminQueries.users().queryKey }), qc.invalidateQueries({ queryKey: outboxKeys.all() })]),
  });
}
