import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { dynoQueries } from './dyno-queries';

export function useDeleteDyno() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.delete<unknown>(`/api/dynos/${id}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: dynoQueries.all() }),
  });
}
