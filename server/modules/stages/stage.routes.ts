import { z } from 'zod';
import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';
import { WORKSHOP } from '@shared/roles';
import { idParams, uuid } from '@shared/schemas/common';
import { partInput, stageInput, stageUpdateInput } from '@shared/schemas/run';
import { addPart, createStage, deletePart, deleteStage, getStage, listStages, reorderStages, setReferenceRun, updatePart, updateStage } from './stage.service';

const partParams = z.object({ id: uuid, partId: uuid });
const reorderInput = z.object({ bikeId: uuid, stageIds: z.array(uuid).min(1).max(200) });
const referenceRunInput = z.object({ runId: uuid.nullable() });

/** Build stages of a bike, their parts and costs, and reference runs. Parts routes answer the updated stage. */
export function stageRoutes(deps: AppDeps): ApiRouter[] {
  const api = new ApiRouter('/api/stages', deps);
  api.route({ method: 'get', path: '/', access: 'signed-in', summary: 'A bike’s stages in build order', query: z.object({ bikeId: uuid }), handler: ({ em, actor, query }) => listStages(em, actor, query.bikeId) });
  api.route({ method: 'post', path: '/', access: WORKSHOP, summary: 'Add a stage (with parts)', body: stageInput, status: 201, handler: ({ em, actor, body }) => createStage(em, actor, body) });
  api.route({ method: 'post', path: '/reorder', access: WORKSHOP, summary: 'Put a bike’s stages in order', body: reorderInput, handler: ({ em, actor, body }) => reorderStages(em, actor, body) });
  api.route({ method: 'get', path: '/:id', access: 'signed-in', summary: 'One stage', params: idParams, handler: ({ em, actor, params }) => getStage(em, actor, params.id) });
  api.route({ method: 'put', path: '/:id', access: WORKSHOP, summary: 'Edit a stage (a parts list replaces the parts)', params: idParams, body: stageUpdateInput, handler: ({ em, actor, params, body }) => updateStage(em, actor, params.id, body) });
  api.route({ method: 'delete', path: '/:id', access: WORKSHOP, summary: 'Remove a stage (its runs stay, without a stage)', params: idParams, handler: ({ em, actor, params }) => deleteStage(em, actor, params.id) });
  api.route({ method: 'post', path: '/:id/reference-run', access: WORKSHOP, summary: 'Choose or clear the stage’s reference run', params: idParams, body: referenceRunInput, handler: ({ em, actor, params, body }) => setReferenceRun(em, actor, params.id, body.runId) });
  api.route({ method: 'post', path: '/:id/parts', access: WORKSHOP, summary: 'Add a part to a stage', params: idParams, body: partInput, status: 201, handler: ({ em, actor, params, body }) => addPart(em, actor, params.id, body) });
  api.route({ method: 'put', path: '/:id/parts/:partId', access: WORKSHOP, summary: 'Edit a part', params: partParams, body: partInput, handler: ({ em, actor, params, body }) => updatePart(em, actor, params.id, params.partId, body) });
  api.route({ method: 'delete', path: '/:id/parts/:partId', access: WORKSHOP, summary: 'Remove a part', params: partParams, handler: ({ em, actor, params }) => deletePart(em, actor, params.id, params.partId) });
  return [api];
}
