import { queryOptions } from '@tanstack/react-query';
import type { DynoDto, SessionDto } from '@shared/schemas/run';
import { api } from '@/lib/api-client';
import { itemsOf, type ListResponse } from '../list-response';

export const sessionQueries = {
  all: () => ['sessions'] as const,
  list: (bikeId: string) =>
    queryOptions({
      queryKey: [...sessionQueries.all(), 'list', { bikeId }] as const,
      queryFn: async () => itemsOf(await api.get<ListResponse<SessionDto>>('/api/sessions', { bikeId })),
    }),
  detail: (id: string) =>
    queryOptions({
      queryKey: [...sessionQueries.all(), 'detail', id] as const,
      queryFn: () => api.get<SessionDto>(`/api/sessions/${id}`),
    }),
  /** The shop's dynos, to choose one for a session (managed in the dynos feature). */
  dynos: () =>
    queryOptions({
      queryKey: ['dynos', 'list'] as const,
      queryFn: async () => itemsOf(await api.get<ListResponse<DynoDto>>('/api/dynos')),
      staleTime: 5 * 60_000,
    }),
};
