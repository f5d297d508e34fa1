import { queryOptions } from '@tanstack/react-query';
import type { DynoDto } from '@shared/schemas/run';
import { api } from '@/lib/api-client';
import { dynoKeys } from '@/lib/query-keys';

export const dynoQueries = {
  all: dynoKeys.all,
  list: () =>
    queryOptions({
      queryKey: dynoKeys.list(),
      queryFn: async () => {
        const r = await api.get<DynoDto[] | { items: DynoDto[] }>('/api/dynos');
        return Array.isArray(r) ? r : r.items;
      },
    }),
};

export const DYNO_KIND_LABELS: Record<DynoDto['kind'], string> = {
  inertia: 'Inertia (roller only)',
  'eddy-current': 'Eddy-current / load-holding',
  other: 'Other',
};
