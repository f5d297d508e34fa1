import { z } from 'zod';
import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';
import { STAFF, WORKSHOP } from '@shared/roles';
import { idParams, uuid, wholePage, type Page } from '@shared/schemas/common';
import {
  applyMappingInput,
  runListQuery,
  runUpdateInput,
  runsStageInput,
  type ColumnLayoutDto,
  type RunDetailDto,
  type RunPreviewDto,
  type RunReprocessDto,
  type RunsStageDto,
  type RunSummaryDto,
  type UploadResponse,
} from '@shared/schemas/run';
import { removeUploadedFiles, runFilesUpload, uploadedFiles } from '../../middleware/upload';
import { ingestFiles } from './upload-runs';
import { listRuns } from './list-runs';
import { runDetail } from './get-run';
import { updateRun } from './update-run';
import { tagRuns } from './tag-runs';
import { deleteRun, restoreRun } from './delete-restore-run';
import { applyMapping } from './apply-mapping';
import { reprocessRunById } from './reprocess-run';
import { runPreview } from './run-preview';
import { contentDisposition, rawFile } from './raw-file';
import { deleteLayout, listLayouts } from './column-layouts';
import { logger } from '../../lib/logger';

const blankToUndefined = (v: unknown) => (v === '' || v === null ? undefined : v);
/** Text fields of the multipart upload. */
const uploadFields = z.object({
  bikeId: uuid,
  sessionId: z.preprocess(blankToUndefined, uuid.optional()),
  stageId: z.preprocess(blankToUndefined, uuid.optional()),
});

/** Routes of the runs domain, and the shop's saved column layouts. */
export function runRoutes(deps: AppDeps): ApiRouter[] {
  const api = new ApiRouter('/api/runs', deps);
  api.route({
    method: 'post',
    path: '/',
    access: WORKSHOP,
    summary: 'Upload run files (multipart field "files"; bikeId, optional sessionId and stageId)',
    before: [runFilesUpload(deps.config)],
    body: uploadFields,
    status: 201,
    handler: async ({ em, actor, body, req, deps: d }): Promise<UploadResponse> => {
      try {
        // Temporary files on disk (multer disk storage): read one at a time, never all in memory.
        const files = uploadedFiles(req).map((f) => ({ originalName: f.originalname, contentType: f.mimetype || null, path: f.path }));
        return { results: await ingestFiles(em, d, actor, body, files) };
      } finally {
        await removeUploadedFiles(req);
      }
    },
  });
  api.route({
    method: 'get',
    path: '/',
    access: 'signed-in',
    summary: 'Runs the caller may see (filter, sort, page)',
    query: runListQuery,
    handler: ({ em, actor, query }): Promise<Page<RunSummaryDto>> => listRuns(em, actor, query),
  });
  api.route({ method: 'get', path: '/:id', access: 'signed-in', summary: 'One run with its curve', params: idParams, handler: ({ em, actor, params }): Promise<RunDetailDto> => runDetail(em, actor, params.id) });
  api.route({
    method: 'get',
    path: '/:id/raw',
    access: STAFF,
    summary: 'The original file, byte for byte',
    params: idParams,
    stream: true,
    headers: { 'Cache-Control': 'private, no-store' },
    handler: async ({ em, actor, params, res, deps: d }) => {
      const { run, obj } = await rawFile(em, d, actor, params.id);
      res.status(200);
      res.set('Content-Type', run.contentType || 'application/octet-stream');
      res.set('Content-Disposition', contentDisposition(run.originalName));
      res.set('Content-Length', String(obj.contentLength ?? run.rawSizeBytes));
      res.set('X-Content-SHA256', run.rawSha256);
      await new Promise<void>((resolve) => {
        obj.body.once('error', (err) => {
          logger.error({ err, key: run.rawKey }, 'raw file download failed mid-stream');
          res.destroy(err);
          resolve();
        });
        res.once('close', () => resolve());
        obj.body.pipe(res);
      });
    },
  });
  api.route({ method: 'post', path: '/stage', access: WORKSHOP, summary: 'Set the stage of several runs of one bike at once', body: runsStageInput, handler: ({ em, actor, body }): Promise<RunsStageDto> => tagRuns(em, actor, body) });
  api.route({ method: 'patch', path: '/:id', access: WORKSHOP, summary: 'Edit a run’s stage, label, tags and note', params: idParams, body: runUpdateInput, handler: ({ em, actor, params, body }): Promise<RunDetailDto> => updateRun(em, actor, params.id, body) });
  api.route({ method: 'delete', path: '/:id', access: ['owner'], summary: 'Soft-delete a run', params: idParams, handler: ({ em, actor, params }): Promise<RunSummaryDto> => deleteRun(em, actor, params.id) });
  api.route({ method: 'post', path: '/:id/restore', access: ['owner'], summary: 'Restore a deleted run', params: idParams, handler: ({ em, actor, params }): Promise<RunSummaryDto> => restoreRun(em, actor, params.id) });
  api.route({ method: 'get', path: '/:id/preview', access: STAFF, summary: 'First rows of the raw file, for the mapping dialog', params: idParams, handler: ({ em, actor, params, deps: d }): Promise<RunPreviewDto> => runPreview(em, d, actor, params.id) });
  api.route({ method: 'post', path: '/:id/mapping', access: WORKSHOP, summary: 'Map columns by hand and re-analyse (optionally save the layout)', params: idParams, body: applyMappingInput, handler: ({ em, actor, params, body, deps: d }): Promise<RunDetailDto> => applyMapping(em, d, actor, params.id, body) });
  api.route({ method: 'post', path: '/:id/reprocess', access: WORKSHOP, summary: 'Re-derive a run from its raw file', params: idParams, handler: ({ em, actor, params, deps: d }): Promise<RunReprocessDto> => reprocessRunById(em, d, actor, params.id) });

  const layouts = new ApiRouter('/api/column-layouts', deps);
  layouts.route({ method: 'get', path: '/', access: STAFF, summary: 'Saved column layouts', handler: async ({ em, actor }): Promise<Page<ColumnLayoutDto>> => wholePage(await listLayouts(em, actor)) });
  layouts.route({ method: 'delete', path: '/:id', access: WORKSHOP, summary: 'Forget a saved column layout', params: idParams, handler: ({ em, actor, params }): Promise<void> => deleteLayout(em, actor, params.id) });
  return [api, layouts];
}
