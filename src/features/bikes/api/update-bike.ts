import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BikeDto } from '@shared/schemas/bike';
import { api } from '@/lib/api-client';
import { customerKeys } from '@/lib/query-keys';
import { bikeQueries } from './bike-queries';
import type { BikeFormData } from './create-bike';

/** Edits a bike; like creating one, it can change lists, suggestions and the customers' bike lists. */
export function useUpdateBike(id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (data: BikeFormData) => api.put<BikeDto>(`/api/bikes/${id}`, data),
    onSuccess: (updated) => {
      qc.setQueryData(bikeQueries.detail(id).queryKey, updated);
      return Promise.all([
        qc.invalidateQueries({ queryKey: bikeQueries.lists() }),
        qc.invalidateQueries({ queryKey: bikeQueries.engineFamilies().queryKey }),
        qc.invalidateQueries({ queryKey: customerKeys.all() }),
      ]);
    },
  });
}
