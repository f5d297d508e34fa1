import { queryOptions } from '@tanstack/react-query';
import type { BikeDto } from '@shared/schemas/bike';
import type { Page } from '@shared/schemas/common';
import type { CustomerDto } from '@shared/schemas/customer';
import { api } from '@/lib/api-client';

const RECENT = { sort: '-createdAt', page: 1, pageSize: 5 };

/**
 * The start page's reads. Their keys name the API resource and its query, exactly as the
 * customers and bikes features key their lists, so those features' mutations (which invalidate
 * ['customers', 'list'] and ['bikes', 'list']) refresh this page too without importing it.
 */
export const homeQueries = {
  all: () => ['home'] as const,
  recentCustomers: () =>
    queryOptions({
      queryKey: ['customers', 'list', RECENT] as const,
      queryFn: () => api.get<Page<CustomerDto>>('/api/customers', RECENT),
    }),
  recentBikes: () =>
    queryOptions({
      queryKey: ['bikes', 'list', RECENT] as const,
      queryFn: () => api.get<Page<BikeDto>>('/api/bikes', RECENT),
    }),
  /** A customer's own bikes; the server answers only theirs. */
  myBikes: () =>
    queryOptions({
      queryKey: ['bikes', 'list', { sort: 'make', page: 1, pageSize: 200 }] as const,
      queryFn: () => api.get<Page<BikeDto>>('/api/bikes', { sort: 'make', page: 1, pageSize: 200 }),
    }),
  shop: () => queryOptions({ queryKey: ['shop'] as const, queryFn: () => api.get<{ name: string }>('/api/shop'), staleTime: 5 * 60_000 }),
};
