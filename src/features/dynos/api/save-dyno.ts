import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { DynoDto, dynoInput } from '@shared/schemas/run';
import { api } from '@/lib/api-client';
import { dynoQueries } from './dyno-queries';

export type DynoInput = z.input<typeof dynoInput>;

/** Add a dyno (no id) or edit one (with id). */
export function useSaveDyno() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...body }: DynoInput & { id?: string }) => (id ? api.put<DynoDto>(`/api/dynos/${id}`, body) : api.post<DynoDto>('/api/dynos', body)),
    onSuccess: () => qc.invalidateQueries({ queryKey: dynoQueries.all() }),
  });
}
