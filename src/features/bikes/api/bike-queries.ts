import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { BikeDto } from '@shared/schemas/bike';
import type { Page } from '@shared/schemas/common';
import type { CustomerDto } from '@shared/schemas/customer';
import type { ShopDto } from '@shared/schemas/shop';
import { api } from '@/lib/api-client';

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
  all: () => ['bikes'] as const,
  lists: () => [...bikeQueries.all(), 'list'] as const,
  list: (filters: BikeListFilters) =>
    queryOptions({
      queryKey: [...bikeQueries.lists(), filters] as const,
      queryFn: () => api.get<Page<BikeDto>>('/api/bikes', { ...filters }),
      placeholderData: keepPreviousData,
    }),
  details: () => [...bikeQueries.all(), 'detail'] as const,
  detail: (id: string) =>
    queryOptions({
      queryKey: [...bikeQueries.details(), id] as const,
      queryFn: () => api.get<BikeDto>(`/api/bikes/${id}`),
    }),
  /** Engine families already used in this shop, most common first — suggestions for the form. */
  engineFamilies: () =>
    queryOptions({
      queryKey: [...bikeQueries.all(), 'engine-families'] as const,
      queryFn: async () => (await api.get<Page<string>>('/api/bikes/engine-families')).items,
      staleTime: 5 * 60_000,
    }),
  /** Customers to choose the bike's owner from, searched on the server. */
  customerOptions: (q: string) =>
    queryOptions({
      queryKey: [...bikeQueries.all(), 'customer-options', q] as const,
      queryFn: () => api.get<Page<CustomerDto>>('/api/customers', { q: q || undefined, sort: 'name', pageSize: 50 }),
      placeholderData: keepPreviousData,
    }),
  /** One customer, to name the bike's owner in the form when the search does not list them. */
  customer: (id: string) =>
    queryOptions({
      queryKey: [...bikeQueries.all(), 'customer', id] as const,
      queryFn: () => api.get<CustomerDto>(`/api/customers/${id}`),
    }),
  /** The shop's settings (same key as the app shell's shop name), for the preferred displacement unit. */
  shop: () => queryOptions({ queryKey: ['shop'] as const, queryFn: () => api.get<ShopDto>('/api/shop'), staleTime: 5 * 60_000 }),
};
