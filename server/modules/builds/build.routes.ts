import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';
import { STAFF } from '@shared/roles';
import { idParams } from '@shared/schemas/common';
import { buildSearchQuery, similarQuery, typicalQuery } from '@shared/schemas/builds';
import { searchBuilds } from './build-search.service';
import { similarBuilds } from './build-similar.service';
import { typicalOutcome } from './build-typical.service';

/**
 * Build finder routes: owner, tuner and desk search their own shop; customers get 403.
 * Two routers: /api/builds, and the bike-scoped "similar" route under /api/bikes (mounted after
 * the bikes router; '/:id/similar' has two segments, so the bikes router's '/:id' never takes it).
 */
export function buildRoutes(deps: AppDeps): ApiRouter[] {
  const builds = new ApiRouter('/api/builds', deps);
  builds.route({ method: 'get', path: '/search', access: STAFF, summary: 'Search past builds of the shop', query: buildSearchQuery, handler: ({ em, actor, query }) => searchBuilds(em, actor, query) });
  builds.route({ method: 'get', path: '/typical', access: STAFF, summary: 'Typical outcome of a planned modification on similar builds', query: typicalQuery, handler: ({ em, actor, query }) => typicalOutcome(em, actor, query) });

  const bikes = new ApiRouter('/api/bikes', deps);
  bikes.route({ method: 'get', path: '/:id/similar', access: STAFF, summary: 'Builds similar to this bike, with reasons', params: idParams, query: similarQuery, handler: ({ em, actor, params, query }) => similarBuilds(em, actor, params.id, query.limit) });
  return [builds, bikes];
}
