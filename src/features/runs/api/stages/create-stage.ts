import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { StageDto, stageInput } from '@shared/schemas/run';
import { api } from '@/lib/api-client';
import { stageQueries } from './stage-queries';

export type StageInput = z.input<typeof stageInput>;

export function useCreateStage() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: StageInput) => api.post<StageDto>('/api/stages', body),
    onSuccess: (stage) => qc.invalidateQueries({ queryKey: stageQueries.list(stage.bikeId).queryKey }),
  });
}
