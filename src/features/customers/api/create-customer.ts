import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { CustomerDto, customerInput } from '@shared/schemas/customer';
import { api } from '@/lib/api-client';
import { customerQueries } from './customer-queries';

export type CustomerData = z.output<typeof customerInput>;

/** Adds a customer; every customer list may now be different, so all of them refetch. */
export function useCreateCustomer() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (data: CustomerData) => api.post<CustomerDto>('/api/customers', data),
    onSuccess: (created) => {
      qc.setQueryData(customerQueries.detail(created.id).queryKey, created);
      return qc.invalidateQueries({ queryKey: customerQueries.lists() });
    },
  });
}
