import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { userKeys } from '@/lib/query-keys';
import { customerQueries } from './customer-queries';

export interface PortalInvite {
  name: string;
  email: string;
}

/**
 * Creates a customer sign-in tied to this customer record and e-mails them an invitation
 * (owner only). The customer's "portal access" flag changes, and the owner's user list grows.
 */
export function useGivePortalAccess(customerId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (invite: PortalInvite) => api.post<{ id: string; email: string }>('/api/users', { ...invite, role: 'customer', customerId }),
    onSuccess: () =>
      Promise.all([
        qc.invalidateQueries({ queryKey: customerQueries.detail(customerId).queryKey }),
        qc.invalidateQueries({ queryKey: customerQueries.lists() }),
        // The admin feature lists users under ['users'].
        qc.invalidateQueries({ queryKey: userKeys.all() }),
      ]),
  });
}
