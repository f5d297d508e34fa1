import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { ShopDto, shopSettingsInput } from '@shared/schemas/shop';
import { api } from '@/lib/api-client';
import { auditKeys } from '@/lib/query-keys';
import { shopQuery } from '@/lib/shop-query';

/** Saves the shop settings; the header's shop name reads the same ['shop'] entry, so it updates at once. */
export function useUpdateShop() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: z.output<typeof shopSettingsInput>) => api.put<ShopDto>('/api/shop', body),
    onSuccess: (shop) => {
      qc.setQueryData(shopQuery().queryKey, shop);
      return qc.invalidateQueries({ queryKey: auditKeys.all() });
    },
  });
}
