import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';
import { STAFF } from '@shared/roles';
import { idParams, uuid } from '@shared/schemas/common';
import { z } from 'zod';
import { deviceTokenInput, dynoCurrentInput, type BayBoardDto, type DeviceTokenCreatedDto, type DeviceTokenDto, type DynoCurrentDto } from '@shared/schemas/bay';
import type { Page } from '@shared/schemas/common';
import { WORKSHOP } from '@shared/roles';
import { createDeviceToken, listDeviceTokens, revokeDeviceToken } from '../device/device-tokens';
import { clearDynoCurrent, setDynoCurrent } from './dyno-current';
import { getBayBoard } from './bay-board';
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
  // Bay capture: the dyno PC's device tokens, what is on the dyno now, the bay board.
  const tokenParams = z.object({ id: uuid, tokenId: uuid });
  api.route({ method: 'get', path: '/:id/device-tokens', access: ['owner'], summary: 'A dyno’s device tokens, with last use', params: idParams, handler: ({ em, actor, params }): Promise<Page<DeviceTokenDto>> => listDeviceTokens(em, actor, params.id) });
  api.route({ method: 'post', path: '/:id/device-tokens', access: ['owner'], summary: 'Create a device token (shown once)', params: idParams, body: deviceTokenInput, status: 201, headers: { 'Cache-Control': 'no-store' }, handler: ({ em, actor, params, body }): Promise<DeviceTokenCreatedDto> => createDeviceToken(em, actor, params.id, body.name) });
  api.route({ method: 'delete', path: '/:id/device-tokens/:tokenId', access: ['owner'], summary: 'Revoke a device token', params: tokenParams, handler: ({ em, actor, params }) => revokeDeviceToken(em, actor, params.id, params.tokenId) });
  api.route({ method: 'put', path: '/:id/current', access: WORKSHOP, summary: 'Set what is on the dyno now', params: idParams, body: dynoCurrentInput, handler: ({ em, actor, params, body }): Promise<DynoCurrentDto> => setDynoCurrent(em, actor, params.id, body) });
  api.route({ method: 'delete', path: '/:id/current', access: WORKSHOP, summary: 'Clear what is on the dyno', params: idParams, handler: ({ em, actor, params }) => clearDynoCurrent(em, actor, params.id) });
  api.route({ method: 'get', path: '/:id/board', access: STAFF, summary: 'The dyno’s bay board', params: idParams, handler: ({ em, actor, params }): Promise<BayBoardDto> => getBayBoard(em, actor, params.id) });
  return [api];
}
