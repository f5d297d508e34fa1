import { queryOptions } from '@tanstack/react-query';
import type { StageDto } from '@shared/schemas/run';
import { api } from '@/lib/api-client';
import { itemsOf, type ListResponse } from '../list-response';

export const stageQueries = {
  all: () => ['stages'] as const,
  list: (bikeId: string) =>
    queryOptions({
      queryKey: [...stageQueries.all(), 'list', { bikeId }] as const,
      queryFn: async () => itemsOf(await api.get<ListResponse<StageDto>>('/api/stages', { bikeId })).sort((a, b) => a.position - b.position),
    }),
};
