import { useCallback, useRef, useState } from 'react';
import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { RunSummaryDto, UploadResponse, UploadResult } from '@shared/schemas/run';
import { ApiError, uploadWithProgress, type ApiErrorCodeOnClient, type UploadProgress } from '@/lib/api-client';
import { invalidateKeys } from '@/lib/invalidate';
import { runViews } from '../run-views';

export interface UploadTarget {
  bikeId: string;
  sessionId?: string;
  stageId?: string;
}

/**
 * One file, one request: each file gets real upload progress and its own result, and one bad
 * file never holds up the others.
 */
export async function uploadRunFile(file: File, target: UploadTarget, onProgress: (p: UploadProgress) => void, signal?: AbortSignal): Promise<UploadResult> {
  const form = new FormData();
  form.append('bikeId', target.bikeId);
  if (target.sessionId) form.append('sessionId', target.sessionId);
  if (target.stageId) form.append('stageId', target.stageId);
  form.append('files', file, file.name);
  try {
    const res = await uploadWithProgress<UploadResponse>('/api/runs', form, onProgress, signal);
    return res.results[0] ?? { file: file.name, ok: false, error: { code: 'NO_RESULT' satisfies ApiErrorCodeOnClient, message: 'The server answered without a result for this file.' } };
  } catch (e) {
    const err = e instanceof ApiError ? e : new ApiError(0, 'UPLOAD', 'The upload failed.');
    return { file: file.name, ok: false, error: { code: err.code, message: err.message } };
  }
}

/** New runs show in every run view (lists, session, stages, gains by stage, comparison candidates, Today). */
export const uploadRunsInvalidates = runViews;

export function invalidateAfterUpload(qc: QueryClient) {
  return invalidateKeys(qc, uploadRunsInvalidates());
}

export type UploadState = 'queued' | 'uploading' | 'analysing' | 'done';

export interface UploadItem {
  key: string;
  file: File;
  state: UploadState;
  loaded: number;
  total: number;
  result?: UploadResult;
}

/** Files at once: enough to keep the line busy without starving the analysis on the server. */
const PARALLEL = 3;

/** Uploads a batch of files with per-file progress and results. */
export function useUploadRuns() {
  const qc = useQueryClient();
  const [items, setItems] = useState<UploadItem[]>([]);
  const [running, setRunning] = useState(false);
  const abort = useRef<AbortController | null>(null);
  const seq = useRef(0);

  const patch = useCallback((key: string, change: Partial<UploadItem>) => {
    setItems((list) => list.map((it) => (it.key === key ? { ...it, ...change } : it)));
  }, []);

  const start = useCallback(
    async (files: File[], target: UploadTarget) => {
      const batch: UploadItem[] = files.map((file) => ({ key: `u${++seq.current}`, file, state: 'queued', loaded: 0, total: file.size }));
      setItems((list) => [...batch, ...list]);
      setRunning(true);
      const controller = new AbortController();
      abort.current = controller;
      const queue = [...batch];
      const worker = async () => {
        for (let it = queue.shift(); it; it = queue.shift()) {
          const key = it.key;
          patch(key, { state: 'uploading' });
          const result = await uploadRunFile(
            it.file,
            target,
            (p) => patch(key, { loaded: p.loaded, total: p.total || it.file.size, state: p.total && p.loaded >= p.total ? 'analysing' : 'uploading' }),
            controller.signal,
          );
          patch(key, { state: 'done', loaded: it.file.size, result });
        }
      };
      await Promise.all(Array.from({ length: Math.min(PARALLEL, batch.length) }, worker));
      abort.current = null;
      setRunning(false);
      await invalidateAfterUpload(qc);
    },
    [patch, qc],
  );

  /** Replace a file's result, e.g. after it was mapped by hand or tagged. */
  const updateResult = useCallback((key: string, result: UploadResult) => patch(key, { result }), [patch]);
  /** Runs of the list that took a stage elsewhere (bulk tagging): show it on their lines. */
  const setStage = useCallback((runIds: string[], stageId: string | null, stageName: string | null) => {
    const ids = new Set(runIds);
    const retag = (run: RunSummaryDto) => (ids.has(run.id) ? { ...run, stageId, stageName } : run);
    setItems((list) =>
      list.map((it) => {
        const r = it.result;
        if (!r?.ok) return it;
        return { ...it, result: { ...r, run: retag(r.run), runs: r.runs?.map(retag) } };
      }),
    );
  }, []);
  const cancel = useCallback(() => abort.current?.abort(), []);
  const clear = useCallback(() => setItems((list) => list.filter((it) => it.state !== 'done')), []);

  return { items, running, start, cancel, clear, updateResult, setStage };
}
