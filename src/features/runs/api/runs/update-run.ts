import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { RunDetailDto, runUpdateInput } from '@shared/schemas/run';
import { api } from '@/lib/api-client';
import { runQueries } from './run-queries';
import { stageQueries } from '../stages/stage-queries';

export type RunUpdate = z.input<typeof runUpdateInput>;

export function updateRun(id: string, body: RunUpdate) {
  return api.patch<RunDetailDto>(`/api/runs/${id}`, body);
}

/** Edit a run's stage, label, tags or note. Stage run counts change, so stages are refetched too. */
export function useUpdateRun() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...body }: RunUpdate & { id: string }) => updateRun(id, body),
    onSuccess: async (_run, vars) => {
      await Promise.all([
        qc.invalidateQueries({ queryKey: runQueries.detail(vars.id).queryKey }),
        qc.invalidateQueries({ queryKey: runQueries.lists() }),
        qc.invalidateQueries({ queryKey: stageQueries.all() }),
      ]);
    },
  });
}
