import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { BikeDto } from '@shared/schemas/bike';
import type { Page } from '@shared/schemas/common';
import type {
  CandidatesDto,
  ComparisonDetailDto,
  ComparisonDto,
  ComparisonPreview,
  ComparisonPreviewInput,
  StageTimelineDto,
} from '@shared/schemas/comparison';
import { api, apiFetch } from '@/lib/api-client';
import { bikeKeys, comparisonKeys } from '@/lib/query-keys';

/** Query keys and fetchers of the comparisons feature; everything of its own lives under ['comparisons']. */
export const comparisonQueries = {
  all: comparisonKeys.all,
  lists: comparisonKeys.lists,
  list: (filters: { bikeId?: string } = {}) =>
    queryOptions({
      queryKey: comparisonKeys.list(filters),
      queryFn: async () => (await api.get<Page<ComparisonDto>>('/api/comparisons', { bikeId: filters.bikeId })).items,
    }),
  detail: (id: string) =>
    queryOptions({
      queryKey: comparisonKeys.detail(id),
      queryFn: () => api.get<ComparisonDetailDto>(`/api/comparisons/${id}`),
    }),
  /** Live figures for the builder; keeps the last preview on screen while the next one loads. */
  preview: (input: ComparisonPreviewInput) =>
    queryOptions({
      queryKey: comparisonKeys.preview(input),
      queryFn: ({ signal }) => apiFetch<ComparisonPreview>('POST', '/api/comparisons/preview', input, { signal }),
      placeholderData: keepPreviousData,
      staleTime: 30_000,
      retry: false,
    }),
  timeline: (bikeId: string) =>
    queryOptions({
      queryKey: comparisonKeys.timeline(bikeId),
      queryFn: () => api.get<StageTimelineDto>('/api/comparisons/timeline', { bikeId }),
    }),
  candidates: (bikeId: string) =>
    queryOptions({
      queryKey: comparisonKeys.candidates(bikeId),
      queryFn: () => api.get<CandidatesDto>('/api/comparisons/candidates', { bikeId }),
    }),
  /** Bikes to add to the builder, searched on the server. */
  bikeOptions: (q: string) =>
    queryOptions({
      queryKey: bikeKeys.list({ q, pageSize: 10 }),
      queryFn: () => api.get<Page<BikeDto>>('/api/bikes', { q: q || undefined, pageSize: 10 }),
      placeholderData: keepPreviousData,
    }),
};
