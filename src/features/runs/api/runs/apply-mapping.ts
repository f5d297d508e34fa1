import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { applyMappingInput, RunSummaryDto, UploadResult } from '@shared/schemas/run';
import { api } from '@/lib/api-client';
import { invalidateKeys } from '@/lib/invalidate';
import { runKeys } from '@/lib/query-keys';
import { runViews } from '../run-views';

export type ApplyMapping = z.input<typeof applyMappingInput>;

/** The route may answer with the run itself or with an upload-style result; take either. */
type MappingResponse = RunSummaryDto | UploadResult | { run: RunSummaryDto };

function runOf(r: MappingResponse): RunSummaryDto | null {
  if ('ok' in r) {
    if (r.ok) return r.run;
    throw Object.assign(new Error(r.error.message), { code: r.error.code });
  }
  if ('run' in r) return r.run;
  return r;
}

/** A re-read run gets a curve and peaks (or loses them): every run view changes. */
export const applyMappingInvalidates = runViews;

export function applyMappingMutation(qc: QueryClient) {
  return {
    mutationFn: async ({ runId, ...body }: ApplyMapping & { runId: string }) => runOf(await api.post<MappingResponse>(`/api/runs/${runId}/mapping`, body)),
    onSuccess: async (_run: RunSummaryDto | null, vars: { runId: string }) => {
      qc.removeQueries({ queryKey: runKeys.preview(vars.runId) });
      await invalidateKeys(qc, applyMappingInvalidates());
    },
  };
}

/** Re-read a kept file with columns chosen by hand (and optionally save the layout for next time). */
export function useApplyMapping() {
  return useMutation(applyMappingMutation(useQueryClient()));
}
