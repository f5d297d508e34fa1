import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';
import { STAFF } from '@shared/roles';
import { idParams } from '@shared/schemas/common';
import { bikeInput, bikeListQuery } from '@shared/schemas/bike';
import { createBike, engineFamilies, getBikeEntity, listBikes, toBikeDto, updateBike } from './bike.service';

const FRONT = ['owner', 'desk'] as const;

export function bikeRoutes(deps: AppDeps) {
  const api = new ApiRouter('/api/bikes', deps);
  api.route({ method: 'get', path: '/', access: 'signed-in', summary: 'Bikes the caller may see', query: bikeListQuery, handler: ({ em, actor, query }) => listBikes(em, actor, query) });
  api.route({ method: 'get', path: '/engine-families', access: STAFF, summary: 'Engine families used in this shop', handler: ({ em, actor }) => engineFamilies(em, actor) });
  api.route({ method: 'post', path: '/', access: FRONT, summary: 'Create a bike', body: bikeInput, status: 201, handler: ({ em, actor, body }) => createBike(em, actor, body) });
  api.route({ method: 'get', path: '/:id', access: 'signed-in', summary: 'One bike', params: idParams, handler: async ({ em, actor, params }) => toBikeDto(await getBikeEntity(em, actor, params.id)) });
  api.route({ method: 'put', path: '/:id', access: FRONT, summary: 'Edit a bike', params: idParams, body: bikeInput, handler: ({ em, actor, params, body }) => updateBike(em, actor, params.id, body) });
  return api;
}
