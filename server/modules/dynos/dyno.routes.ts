import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';
import { STAFF } from '@shared/roles';
import { idParams } from '@shared/schemas/common';
import { dynoInput } from '@shared/schemas/run';
import { createDyno, deleteDyno, getDynoEntity, listDynos, toDynoDto, updateDyno } from './dyno.service';

/** The shop's dynamometers: staff read them, the owner manages them. */
export function dynoRoutes(deps: AppDeps): ApiRouter[] {
  const api = new ApiRouter('/api/dynos', deps);
  api.route({ method: 'get', path: '/', access: STAFF, summary: 'The shop’s dynos', handler: ({ em, actor }) => listDynos(em, actor) });
  api.route({ method: 'get', path: '/:id', access: STAFF, summary: 'One dyno', params: idParams, handler: async ({ em, actor, params }) => toDynoDto(await getDynoEntity(em, actor, params.id)) });
  api.route({ method: 'post', path: '/', access: ['owner'], summary: 'Add a dyno', body: dynoInput, status: 201, handler: ({ em, actor, body }) => createDyno(em, actor, body) });
  api.route({ method: 'put', path: '/:id', access: ['owner'], summary: 'Edit a dyno', params: idParams, body: dynoInput, handler: ({ em, actor, params, body }) => updateDyno(em, actor, params.id, body) });
  api.route({ method: 'delete', path: '/:id', access: ['owner'], summary: 'Remove a dyno', params: idParams, handler: ({ em, actor, params }) => deleteDyno(em, actor, params.id) });
  return [api];
}
