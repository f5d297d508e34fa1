import type { RunsStageDto } from '@shared/schemas/run';
import { api } from '@/lib/api-client';
import { runViews } from '../run-views';

/** Set the stage of several runs of one bike (POST /api/runs/stage). */
export function tagRuns(runIds: string[], stageId: string | null) {
  return api.post<RunsStageDto>('/api/runs/stage', { runIds, stageId });
}

/** Re-tagging moves runs between stages: every run view changes (refreshed once, after the batch). */
export const tagRunsInvalidates = runViews;
