import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DeviceTokenCreatedDto } from '@shared/schemas/bay';
import { api } from '@/lib/api-client';
import { dynoKeys } from '@/lib/query-keys';

/** Create a device token for a dyno; the answer holds the token, shown once. */
export function useCreateDeviceToken(dynoId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (name: string) => api.post<DeviceTokenCreatedDto>(`/api/dynos/${dynoId}/device-tokens`, { name }),
    onSuccess: () => qc.invalidateQueries({ queryKey: dynoKeys.tokens(dynoId) }),
  });
}

/** Revoke a device token: its agent is refused from the next request on. */
export function useRevokeDeviceToken(dynoId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (tokenId: string) => api.delete<void>(`/api/dynos/${dynoId}/device-tokens/${tokenId}`),
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: dynoKeys.tokens(dynoId) }), qc.invalidateQueries({ queryKey: dynoKeys.board(dynoId) })]),
  });
}
