import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CustomerDto } from '@shared/schemas/customer';
import { api } from '@/lib/api-client';
import { customerQueries } from './customer-queries';
import type { CustomerData } from './create-customer';

/**
 * Edits a customer. Lists refetch (name and sort order may change), and so do bike queries,
 * which carry the customer's name.
 */
export function useUpdateCustomer(id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (data: CustomerData) => api.put<CustomerDto>(`/api/customers/${id}`, data),
    onSuccess: (updated) => {
      qc.setQueryData(customerQueries.detail(id).queryKey, updated);
      return Promise.all([qc.invalidateQueries({ queryKey: customerQueries.lists() }), qc.invalidateQueries({ queryKey: ['bikes'] })]);
    },
  });
}
