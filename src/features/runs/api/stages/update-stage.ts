import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { StageDto, stageUpdateInput } from '@shared/schemas/run';
import { api } from '@/lib/api-client';
import { stageQueries } from './stage-queries';
import { runQueries } from '../runs/run-queries';

export type StageUpdate = z.input<typeof stageUpdateInput>;

/** Edit a stage and its parts; run lists show the stage name, so they refetch too. */
export function useUpdateStage() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...body }: StageUpdate & { id: string }) => api.put<StageDto>(`/api/stages/${id}`, body),
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: stageQueries.all() }), qc.invalidateQueries({ queryKey: runQueries.all() })]),
  });
}
