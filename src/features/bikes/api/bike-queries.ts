import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { BikeDto } from '@shared/schemas/bike';
import type { Page } from '@shared/schemas/common';
import type { CustomerDto } from '@shared/schemas/customer';
import type { StageTimelineDto } from '@shared/schemas/comparison';
import { api } from '@/lib/api-client';
import { bikeKeys, comparisonKeys, customerKeys } from '@/lib/query-keys';

/** A page of the bike table as the server sorts and filters it. `sort` is "make" or "-make". */
export interface BikeListFilters {
  q?: string;
  sort?: string;
  page: number;
  pageSize: number;
  customerId?: string;
}

/** Query keys and fetchers of the bikes feature; everything of its own lives under ['bikes']. */
export const bikeQueries = {
  all: bikeKeys.all,
  lists: bikeKeys.lists,
  list: (filters: BikeListFilters) =>
    queryOptions({
      queryKey: bikeKeys.list(filters),
      queryFn: () => api.get<Page<BikeDto>>('/api/bikes', { ...filters }),
      placeholderData: keepPreviousData,
    }),
  detail: (id: string) =>
    queryOptions({
      queryKey: bikeKeys.detail(id),
      queryFn: () => api.get<BikeDto>(`/api/bikes/${id}`),
    }),
  /**
   * The bike's stages with gains and cost per hp (the comparisons module computes them). Under the
   * comparisons' timeline key, so whatever refreshes the timeline (uploads, re-tagging) refreshes this.
   */
  stageGains: (bikeId: string) =>
    queryOptions({
      queryKey: comparisonKeys.timeline(bikeId),
      queryFn: () => api.get<StageTimelineDto>('/api/comparisons/timeline', { bikeId }),
    }),
  /** Engine families already used in this shop, most common first — suggestions for the form. */
  engineFamilies: () =>
    queryOptions({
      queryKey: bikeKeys.engineFamilies(),
      queryFn: async () => (await api.get<Page<string>>('/api/bikes/engine-families')).items,
      staleTime: 5 * 60_000,
    }),
  /** Customers to choose the bike's owner from, searched on the server. */
  customerOptions: (q: string) =>
    queryOptions({
      queryKey: customerKeys.list({ q, sort: 'name', pageSize: 50 }),
      queryFn: () => api.get<Page<CustomerDto>>('/api/customers', { q: q || undefined, sort: 'name', pageSize: 50 }),
      placeholderData: keepPreviousData,
    }),
  /** One customer, to name the bike's owner in the form when the search does not list them. */
  customer: (id: string) =>
    queryOptions({
      queryKey: customerKeys.detail(id),
      queryFn: () => api.get<CustomerDto>(`/api/customers/${id}`),
    }),
};
