import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ShopDto } from '@shared/schemas/shop';
import { api } from '@/lib/api-client';
import type { UnitSystem } from '@/lib/air-conditions';

/** The caller's shop, for its unit system (the same cache entry other screens use). */
export const shopQueries = {
  shop: () => queryOptions({ queryKey: ['shop'] as const, queryFn: () => api.get<ShopDto>('/api/shop'), staleTime: 5 * 60_000 }),
};

/** The shop's unit system for showing air conditions (imperial until the shop has loaded). */
export function useShopUnits(): UnitSystem {
  return useQuery(shopQueries.shop()).data?.units ?? 'imperial';
}
