import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { outboxKeys } from '@/lib/query-keys';

/** Sends a fresh invitation link (the old one stops working); a new message lands in the outbox. */
export function useResendInvite() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.post<{ ok: true }>(`/api/users/${id}/resend-invite`),
    onSuccess: () => qc.invalidateQueries({ queryKey: outboxKeys.all() }),
  });
}
