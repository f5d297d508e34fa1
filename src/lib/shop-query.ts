import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ShopDto } from '@shared/schemas/shop';
import { api } from './api-client';
import type { UnitSystem } from '@shared/units-display';

/** The caller's shop (its name and unit system), under the ['shop'] entry every screen shares. */
export const shopQuery = () => queryOptions({ queryKey: ['shop'] as const, queryFn: () => api.get<ShopDto>('/api/shop'), staleTime: 5 * 60_000 });

/**
 * The shop's unit system for showing air conditions. Until the shop has loaded (or if it cannot
 * be), the units Pullbook stores (°C, kPa), which are never wrong, only perhaps unfamiliar.
 */
export function useShopUnits(): UnitSystem {
  return useQuery(shopQuery()).data?.units ?? 'metric';
}
