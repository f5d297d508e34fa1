import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { InboxAssignResponse, InboxItemDto, inboxAssignInput } from '@shared/schemas/bay';
import type { BikeDto } from '@shared/schemas/bike';
import type { SessionDto, StageDto } from '@shared/schemas/run';
import type { Page } from '@shared/schemas/common';
import { api } from '@/lib/api-client';
import { bikeKeys, inboxKeys, runKeys, sessionKeys, stageKeys } from '@/lib/query-keys';

export type InboxAssignInput = z.input<typeof inboxAssignInput>;

export const inboxQueries = {
  list: () =>
    queryOptions({
      queryKey: inboxKeys.list(),
      queryFn: async () => (await api.get<Page<InboxItemDto>>('/api/runs/inbox')).items,
      refetchInterval: 30_000,
    }),
  bikes: (q: string) =>
    queryOptions({
      queryKey: bikeKeys.options({ q, for: 'inbox' }),
      queryFn: async () => (await api.get<Page<BikeDto>>('/api/bikes', { q: q || undefined, pageSize: 20, sort: '-createdAt' })).items,
    }),
  sessions: (bikeId: string) =>
    queryOptions({
      queryKey: sessionKeys.list(bikeId),
      queryFn: async () => (await api.get<Page<SessionDto>>('/api/sessions', { bikeId })).items,
    }),
  stages: (bikeId: string) =>
    queryOptions({
      queryKey: stageKeys.list(bikeId),
      queryFn: async () => (await api.get<Page<StageDto>>('/api/stages', { bikeId })).items.sort((a, b) => a.position - b.position),
    }),
};

/** Assign a waiting file: the normal upload pipeline makes its runs. */
export function useAssignInboxItem() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...body }: InboxAssignInput & { id: string }) => api.post<InboxAssignResponse>(`/api/runs/inbox/${id}/assign`, body),
    onSettled: () => Promise.all([qc.invalidateQueries({ queryKey: inboxKeys.all() }), qc.invalidateQueries({ queryKey: runKeys.all() }), qc.invalidateQueries({ queryKey: sessionKeys.all() })]),
  });
}
