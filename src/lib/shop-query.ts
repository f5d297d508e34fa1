import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ShopDto } from '@shared/schemas/shop';
import { api } from './api-client';
import type { UnitSystem } from '@shared/units-display';
import { shopKeys } from './query-keys';

/**
 * The caller's shop (name, units, settings): the one definition of the ['shop'] entry that the
 * header, the settings page, the bike form and every unit display share.
 */
export const shopQuery = () => queryOptions({ queryKey: shopKeys.all(), queryFn: () => api.get<ShopDto>('/api/shop'), staleTime: 5 * 60_000 });

/**
 * The shop's unit system for showing air conditions. Until the shop has loaded (or if it cannot
 * be), the units Pullbook stores (°C, kPa), which are never wrong, only perhaps unfamiliar.
 */
export function useShopUnits(): UnitSystem {
  return useQuery(shopQuery()).data?.units ?? 'metric';
}
