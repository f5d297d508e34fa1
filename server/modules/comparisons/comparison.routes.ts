import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';
import { STAFF, WORKSHOP } from '@shared/roles';
import { idParams, wholePage } from '@shared/schemas/common';
import { candidatesQuery, comparisonInput, comparisonListQuery, comparisonPreviewInput, timelineQuery } from '@shared/schemas/comparison';
import { evaluateComparison } from './evaluate-comparison';
import { createComparison, deleteComparison, getComparison, listComparisons } from './saved-comparisons';
import { stageTimeline } from './stage-timeline';
import { comparisonCandidates } from './comparison-candidates';

/**
 * Comparisons: preview (staff), save (staff), read (staff; customers their own bikes, read-only),
 * delete (owner, tuner), and a bike's stage timeline. `/timeline` is registered before `/:id`.
 */
export function comparisonRoutes(deps: AppDeps): ApiRouter[] {
  const api = new ApiRouter('/api/comparisons', deps);
  api.route({ method: 'post', path: '/preview', access: STAFF, summary: 'Compute a comparison without saving it', body: comparisonPreviewInput, handler: ({ em, actor, body }) => evaluateComparison(em, actor, body) });
  api.route({ method: 'get', path: '/timeline', access: 'signed-in', summary: "A bike's stages with gains, costs and cost per hp", query: timelineQuery, handler: ({ em, actor, query }) => stageTimeline(em, actor, query) });
  api.route({ method: 'get', path: '/candidates', access: STAFF, summary: "A bike's runs and the suggested pair for the builder", query: candidatesQuery, handler: ({ em, actor, query }) => comparisonCandidates(em, actor, query) });
  api.route({ method: 'get', path: '/', access: 'signed-in', summary: 'Saved comparisons (customers: their bikes)', query: comparisonListQuery, handler: async ({ em, actor, query }) => wholePage(await listComparisons(em, actor, query)) });
  api.route({ method: 'post', path: '/', access: STAFF, summary: 'Save a comparison', body: comparisonInput, status: 201, handler: ({ em, actor, body }) => createComparison(em, actor, body) });
  api.route({ method: 'get', path: '/:id', access: 'signed-in', summary: 'A saved comparison with its figures', params: idParams, handler: ({ em, actor, params }) => getComparison(em, actor, params.id) });
  api.route({ method: 'delete', path: '/:id', access: WORKSHOP, summary: 'Delete a saved comparison', params: idParams, handler: ({ em, actor, params }) => deleteComparison(em, actor, params.id) });
  return [api];
}
