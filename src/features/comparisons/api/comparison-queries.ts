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

/** Query keys and fetchers of the comparisons feature; everything of its own lives under ['comparisons']. */
export const comparisonQueries = {
  all: () => ['comparisons'] as const,
  lists: () => [...comparisonQueries.all(), 'list'] as const,
  list: (filters: { bikeId?: string } = {}) =>
    queryOptions({
      queryKey: [...comparisonQueries.lists(), filters] as const,
      queryFn: () => api.get<ComparisonDto[]>('/api/comparisons', { bikeId: filters.bikeId }),
    }),
  details: () => [...comparisonQueries.all(), 'detail'] as const,
  detail: (id: string) =>
    queryOptions({
      queryKey: [...comparisonQueries.details(), id] as const,
      queryFn: () => api.get<ComparisonDetailDto>(`/api/comparisons/${id}`),
    }),
  /** Live figures for the builder; keeps the last preview on screen while the next one loads. */
  preview: (input: ComparisonPreviewInput) =>
    queryOptions({
      queryKey: [...comparisonQueries.all(), 'preview', input] as const,
      queryFn: ({ signal }) => apiFetch<ComparisonPreview>('POST', '/api/comparisons/preview', input, { signal }),
      placeholderData: keepPreviousData,
      staleTime: 30_000,
      retry: false,
    }),
  timeline: (bikeId: string) =>
    queryOptions({
      queryKey: [...comparisonQueries.all(), 'timeline', bikeId] as const,
      queryFn: () => api.get<StageTimelineDto>('/api/comparisons/timeline', { bikeId }),
    }),
  candidates: (bikeId: string) =>
    queryOptions({
      queryKey: [...comparisonQueries.all(), 'candidates', bikeId] as const,
      queryFn: () => api.get<CandidatesDto>('/api/comparisons/candidates', { bikeId }),
    }),
  /** Bikes to add to the builder, searched on the server. */
  bikeOptions: (q: string) =>
    queryOptions({
      queryKey: [...comparisonQueries.all(), 'bike-options', q] as const,
      queryFn: () => api.get<Page<BikeDto>>('/api/bikes', { q: q || undefined, pageSize: 10 }),
      placeholderData: keepPreviousData,
    }),
};
