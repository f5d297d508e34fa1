import { queryOptions } from '@tanstack/react-query';
import type { DynoDto } from '@shared/schemas/run';
import type { Page } from '@shared/schemas/common';
import { api } from '@/lib/api-client';

export const dynoQueries = {
  all: () => ['dynos'] as const,
  list: () =>
    queryOptions({
      queryKey: [...dynoQueries.all(), 'list'] as const,
      queryFn: async () => (await api.get<Page<DynoDto>>('/api/dynos')).items,
    }),
};

export const DYNO_KIND_LABELS: Record<DynoDto['kind'], string> = {
  inertia: 'Inertia (roller only)',
  'eddy-current': 'Eddy-current / load-holding',
  other: 'Other',
};
