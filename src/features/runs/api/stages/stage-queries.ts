import { queryOptions } from '@tanstack/react-query';
import type { StageDto } from '@shared/schemas/run';
import { api } from '@/lib/api-client';
import { stageKeys } from '@/lib/query-keys';
import { itemsOf, type ListResponse } from '../list-response';

export const stageQueries = {
  all: stageKeys.all,
  list: (bikeId: string) =>
    queryOptions({
      queryKey: stageKeys.list(bikeId),
      queryFn: async () => itemsOf(await api.get<ListResponse<StageDto>>('/api/stages', { bikeId })).sort((a, b) => a.position - b.position),
    }),
};
