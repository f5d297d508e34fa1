import { infiniteQueryOptions, queryOptions } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { buildKeys } from '@/lib/query-keys';
import type { BuildSearchPage, SimilarBuildsDto, TypicalOutcomeDto } from '@shared/schemas/builds';

export type { BuildItemDto, BuildSearchPage, SimilarBuildDto, SimilarBuildsDto, TypicalOutcomeDto } from '@shared/schemas/builds';

/** Search filters as the URL and the API carry them (every value a string; blank = not set). */
export type FinderFilters = Record<string, string>;

/** Query keys and fetchers of the build finder. */
export const finderQueries = {
  search: (filters: FinderFilters) =>
    infiniteQueryOptions({
      queryKey: buildKeys.search(filters),
      queryFn: ({ pageParam }) => api.get<BuildSearchPage>('/api/builds/search', { ...filters, cursor: pageParam ?? undefined }),
      initialPageParam: null as string | null,
      getNextPageParam: (last) => last.nextCursor,
    }),
  similar: (bikeId: string) =>
    queryOptions({
      queryKey: buildKeys.similar(bikeId),
      queryFn: () => api.get<SimilarBuildsDto>(`/api/bikes/${bikeId}/similar`),
    }),
  typical: (bikeId: string, category: string, level?: string) =>
    queryOptions({
      queryKey: buildKeys.typical(bikeId, category, level ?? ''),
      queryFn: () => api.get<TypicalOutcomeDto>('/api/builds/typical', { bikeId, category, level }),
    }),
};
