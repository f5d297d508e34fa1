import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { customerQueries } from './customer-queries';

/** Deletes a customer without bikes (owner only; the server refuses while bikes remain). */
export function useDeleteCustomer(id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api.delete<void>(`/api/customers/${id}`),
    onSuccess: () => {
      qc.removeQueries({ queryKey: customerQueries.detail(id).queryKey });
      return qc.invalidateQueries({ queryKey: customerQueries.lists() });
    },
  });
}
