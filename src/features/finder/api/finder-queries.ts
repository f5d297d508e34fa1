import { infiniteQueryOptions, queryOptions } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { BuildSearchPage, SimilarBuildsDto, TypicalOutcomeDto } from '@shared/schemas/builds';

export type { BuildItemDto, BuildSearchPage, SimilarBuildDto, SimilarBuildsDto, TypicalOutcomeDto } from '@shared/schemas/builds';

/** Search filters as the URL and the API carry them (every value a string; blank = not set). */
export type FinderFilters = Record<string, string>;

/** Query keys and fetchers of the build finder. */
export const finderQueries = {
  all: ['finder'] as const,
  search: (filters: FinderFilters) =>
    infiniteQueryOptions({
      queryKey: [...finderQueries.all, 'search', filters] as const,
      queryFn: ({ pageParam }) => api.get<BuildSearchPage>('/api/builds/search', { ...filters, cursor: pageParam ?? undefined }),
      initialPageParam: null as string | null,
      getNextPageParam: (last) => last.nextCursor,
    }),
  similar: (bikeId: string) =>
    queryOptions({
      queryKey: [...finderQueries.all, 'similar', bikeId] as const,
      queryFn: () => api.get<SimilarBuildsDto>(`/api/bikes/${bikeId}/similar`),
    }),
  typical: (bikeId: string, category: string, level?: string) =>
    queryOptions({
      queryKey: [...finderQueries.all, 'typical', bikeId, category, level ?? ''] as const,
      queryFn: () => api.get<TypicalOutcomeDto>('/api/builds/typical', { bikeId, category, level }),
    }),
};
