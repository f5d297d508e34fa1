import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { RunDetailDto, runUpdateInput } from '@shared/schemas/run';
import { api } from '@/lib/api-client';
import { invalidateKeys } from '@/lib/invalidate';
import { runViews } from '../run-views';

export type RunUpdate = z.input<typeof runUpdateInput>;

export function updateRun(id: string, body: RunUpdate) {
  return api.patch<RunDetailDto>(`/api/runs/${id}`, body);
}

/**
 * A run's stage, label, tags or note: every run view shows them (a stage change moves the run
 * between stages, the gains by stage and the comparison candidates).
 */
export const updateRunInvalidates = runViews;

export function updateRunMutation(qc: QueryClient) {
  return {
    mutationFn: ({ id, ...body }: RunUpdate & { id: string }) => updateRun(id, body),
    onSuccess: () => invalidateKeys(qc, updateRunInvalidates()),
  };
}

/** Edit a run's stage, label, tags or note. */
export function useUpdateRun() {
  return useMutation(updateRunMutation(useQueryClient()));
}
