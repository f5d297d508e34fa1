import { queryOptions } from '@tanstack/react-query';
import type { BayBoardDto, DeviceTokenDto } from '@shared/schemas/bay';
import type { BikeDto } from '@shared/schemas/bike';
import type { StageDto } from '@shared/schemas/run';
import type { Page } from '@shared/schemas/common';
import { api } from '@/lib/api-client';
import { bikeKeys, dynoKeys, stageKeys } from '@/lib/query-keys';

/** Bay capture reads: a dyno's device tokens, its bay board, and what the pickers offer. */
export const bayQueries = {
  tokens: (dynoId: string) =>
    queryOptions({
      queryKey: dynoKeys.tokens(dynoId),
      queryFn: async () => (await api.get<Page<DeviceTokenDto>>(`/api/dynos/${dynoId}/device-tokens`)).items,
    }),
  board: (dynoId: string) =>
    queryOptions({
      queryKey: dynoKeys.board(dynoId),
      queryFn: () => api.get<BayBoardDto>(`/api/dynos/${dynoId}/board`),
      // The live feed refreshes pulls; this keeps "agent last heard" current between them.
      refetchInterval: 20_000,
    }),
  bikeOptions: (q: string) =>
    queryOptions({
      queryKey: bikeKeys.options({ q, for: 'bay' }),
      queryFn: async () => (await api.get<Page<BikeDto>>('/api/bikes', { q: q || undefined, pageSize: 12, sort: '-createdAt' })).items,
    }),
  stages: (bikeId: string) =>
    queryOptions({
      queryKey: stageKeys.list(bikeId),
      queryFn: async () => (await api.get<Page<StageDto>>('/api/stages', { bikeId })).items.sort((a, b) => a.position - b.position),
    }),
};
