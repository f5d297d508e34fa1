import { queryOptions } from '@tanstack/react-query';
import type { ShopDto } from '@shared/schemas/shop';
import { api } from '@/lib/api-client';

/** The caller's shop, for its unit system (the same cache entry other screens use). */
export const shopQueries = {
  shop: () => queryOptions({ queryKey: ['shop'] as const, queryFn: () => api.get<ShopDto>('/api/shop'), staleTime: 5 * 60_000 }),
};
