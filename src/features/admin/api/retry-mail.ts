import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { Page } from '@shared/schemas/common';
import type { MailLogEntry } from '@shared/schemas/outbox';
import { api } from '@/lib/api-client';
import { outboxKeys } from '@/lib/query-keys';

export type { MailLogEntry };

/** The shop's send log; refreshed every few seconds while something is still queued. */
export const mailLogQuery = () =>
  queryOptions({
    queryKey: outboxKeys.log(),
    queryFn: async () => (await api.get<Page<MailLogEntry>>('/api/outbox/log')).items,
    refetchInterval: (q) => (q.state.data?.some((m) => m.status === 'queued') ? 5000 : false),
  });

/** Queues a failed message again (or tries a queued one now). */
export function useRetryMail() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.post<{ ok: true }>(`/api/outbox/log/${id}/retry`),
    onSettled: () => qc.invalidateQueries({ queryKey: outboxKeys.all() }),
  });
}
