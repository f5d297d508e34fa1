import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { Page } from '@shared/schemas/common';
import type { CustomerDto } from '@shared/schemas/customer';
import type { BikeDto } from '@shared/schemas/bike';
import { api } from '@/lib/api-client';
import { customerKeys } from '@/lib/query-keys';

/** A page of the customer table as the server sorts and filters it. `sort` is "name" or "-name". */
export interface CustomerListFilters {
  q?: string;
  sort?: string;
  page: number;
  pageSize: number;
}

/**
 * Query keys and fetchers of the customers feature. Everything lives under ['customers'], so a
 * mutation can invalidate the whole feature with `customerQueries.all()`.
 */
export const customerQueries = {
  all: customerKeys.all,
  lists: customerKeys.lists,
  list: (filters: CustomerListFilters) =>
    queryOptions({
      queryKey: customerKeys.list(filters),
      queryFn: () => api.get<Page<CustomerDto>>('/api/customers', { ...filters }),
      // Keep the old page on screen while the next one loads, so the table does not jump.
      placeholderData: keepPreviousData,
    }),
  detail: (id: string) =>
    queryOptions({
      queryKey: customerKeys.detail(id),
      queryFn: () => api.get<CustomerDto>(`/api/customers/${id}`),
    }),
  /** The customer's bikes. Under the customer's key: bike changes invalidate ['customers'] too, as bike counts change. */
  bikes: (id: string) =>
    queryOptions({
      queryKey: customerKeys.bikes(id),
      queryFn: () => api.get<Page<BikeDto>>('/api/bikes', { customerId: id, sort: 'make', pageSize: 200 }),
    }),
};
