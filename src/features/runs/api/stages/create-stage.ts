import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { StageDto, stageInput } from '@shared/schemas/run';
import { api } from '@/lib/api-client';
import { invalidateKeys } from '@/lib/invalidate';
import { comparisonKeys, stageKeys } from '@/lib/query-keys';

export type StageInput = z.input<typeof stageInput>;

/** A new stage shows in the bike's stage list and as an empty step of its gains by stage. */
export const createStageInvalidates = (bikeId: string) => [stageKeys.list(bikeId), comparisonKeys.timeline(bikeId)];

export function useCreateStage() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: StageInput) => api.post<StageDto>('/api/stages', body),
    onSuccess: (stage) => invalidateKeys(qc, createStageInvalidates(stage.bikeId)),
  });
}
