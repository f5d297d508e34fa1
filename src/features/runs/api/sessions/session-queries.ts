import { queryOptions } from '@tanstack/react-query';
import type { DynoDto, SessionDto } from '@shared/schemas/run';
import { api } from '@/lib/api-client';
import { dynoKeys, sessionKeys } from '@/lib/query-keys';
import { itemsOf, type ListResponse } from '../list-response';

export const sessionQueries = {
  all: sessionKeys.all,
  list: (bikeId: string) =>
    queryOptions({
      queryKey: sessionKeys.list(bikeId),
      queryFn: async () => itemsOf(await api.get<ListResponse<SessionDto>>('/api/sessions', { bikeId })),
    }),
  detail: (id: string) =>
    queryOptions({
      queryKey: sessionKeys.detail(id),
      queryFn: () => api.get<SessionDto>(`/api/sessions/${id}`),
    }),
  /** The shop's dynos, to choose one for a session (managed in the dynos feature). */
  dynos: () =>
    queryOptions({
      queryKey: dynoKeys.list(),
      queryFn: async () => itemsOf(await api.get<ListResponse<DynoDto>>('/api/dynos')),
      staleTime: 5 * 60_000,
    }),
};
