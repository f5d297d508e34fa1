import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { applyMappingInput, RunSummaryDto, UploadResult } from '@shared/schemas/run';
import { api } from '@/lib/api-client';
import { runQueries } from './run-queries';
import { sessionQueries } from '../sessions/session-queries';
import { stageQueries } from '../stages/stage-queries';

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

/** Re-read a kept file with columns chosen by hand (and optionally save the layout for next time). */
export function useApplyMapping() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async ({ runId, ...body }: ApplyMapping & { runId: string }) => runOf(await api.post<MappingResponse>(`/api/runs/${runId}/mapping`, body)),
    onSuccess: async (_run, vars) => {
      qc.removeQueries({ queryKey: runQueries.preview(vars.runId).queryKey });
      await Promise.all([
        qc.invalidateQueries({ queryKey: runQueries.all() }),
        qc.invalidateQueries({ queryKey: sessionQueries.all() }),
        qc.invalidateQueries({ queryKey: stageQueries.all() }),
      ]);
    },
  });
}
