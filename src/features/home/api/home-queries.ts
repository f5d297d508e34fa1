import { queryOptions } from '@tanstack/react-query';
import type { BikeDto } from '@shared/schemas/bike';
import type { Page } from '@shared/schemas/common';
import type { CustomerDto } from '@shared/schemas/customer';
import { api } from '@/lib/api-client';
import { bikeKeys, customerKeys } from '@/lib/query-keys';

const RECENT = { sort: '-createdAt', page: 1, pageSize: 5 };
const MINE = { sort: 'make', page: 1, pageSize: 200 };

/**
 * The start page's reads. Their keys name the API resource and its query, exactly as the
 * customers and bikes features key their lists, so those features' mutations (which invalidate
 * ['customers', 'list'] and ['bikes', 'list']) refresh this page too without importing it.
 */
export const homeQueries = {
  recentCustomers: () =>
    queryOptions({
      queryKey: customerKeys.list(RECENT),
      queryFn: () => api.get<Page<CustomerDto>>('/api/customers', RECENT),
    }),
  recentBikes: () =>
    queryOptions({
      queryKey: bikeKeys.list(RECENT),
      queryFn: () => api.get<Page<BikeDto>>('/api/bikes', RECENT),
    }),
  /** A customer's own bikes; the server answers only theirs. */
  myBikes: () =>
    queryOptions({
      queryKey: bikeKeys.list(MINE),
      queryFn: () => api.get<Page<BikeDto>>('/api/bikes', MINE),
    }),
};
