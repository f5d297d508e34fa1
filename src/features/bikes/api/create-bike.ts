import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { BikeDto, bikeFormSchema } from '@shared/schemas/bike';
import { api } from '@/lib/api-client';
import { customerKeys } from '@/lib/query-keys';
import { bikeQueries } from './bike-queries';

/** What the form sends: displacement in the unit the user chose; the server stores cm³. */
export type BikeFormData = z.output<typeof bikeFormSchema>;

/**
 * Adds a bike. Bike lists and engine-family suggestions refetch; so does everything under
 * ['customers'], because a customer's bike count and bike list change.
 */
export function useCreateBike() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (data: BikeFormData) => api.post<BikeDto>('/api/bikes', data),
    onSuccess: (created) => {
      qc.setQueryData(bikeQueries.detail(created.id).queryKey, created);
      return Promise.all([
        qc.invalidateQueries({ queryKey: bikeQueries.lists() }),
        qc.invalidateQueries({ queryKey: bikeQueries.engineFamilies().queryKey }),
        qc.invalidateQueries({ queryKey: customerKeys.all() }),
      ]);
    },
  });
}
