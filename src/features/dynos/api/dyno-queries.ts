import { queryOptions } from '@tanstack/react-query';
import type { DynoDto } from '@shared/schemas/run';
import type { Page } from '@shared/schemas/common';
import { api } from '@/lib/api-client';
import { dynoKeys } from '@/lib/query-keys';

export const dynoQueries = {
  all: dynoKeys.all,
  list: () =>
    queryOptions({
      queryKey: dynoKeys.list(),
      queryFn: async () => (await api.get<Page<DynoDto>>('/api/dynos')).items,
    }),
};

export const DYNO_KIND_LABELS: Record<DynoDto['kind'], string> = {
  inertia: 'Inertia (roller only)',
  'eddy-current': 'Eddy-current / load-holding',
  other: 'Other',
};
