import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { StageDto, stageUpdateInput } from '@shared/schemas/run';
import { api } from '@/lib/api-client';
import { invalidateKeys } from '@/lib/invalidate';
import { runViews } from '../run-views';

export type StageUpdate = z.input<typeof stageUpdateInput>;

/** A stage's name, order and parts show wherever its runs do (run lists, gains by stage, finder). */
export const updateStageInvalidates = runViews;

/** Edit a stage and its parts. */
export function useUpdateStage() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...body }: StageUpdate & { id: string }) => api.put<StageDto>(`/api/stages/${id}`, body),
    onSuccess: () => invalidateKeys(qc, updateStageInvalidates()),
  });
}
