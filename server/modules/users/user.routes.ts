import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';
import { idParams, type OkDto } from '@shared/schemas/common';
import { inviteUserInput, updateUserInput } from '@shared/schemas/auth';
import { inviteUser, listUsers, resendInvite, updateUser } from './user.service';

export function userRoutes(deps: AppDeps) {
  const api = new ApiRouter('/api/users', deps);
  const { config } = deps;

  api.route({ method: 'get', path: '/', access: ['owner'], summary: 'List the shop’s users', handler: ({ em, actor }) => listUsers(em, actor) });
  api.route({
    method: 'post',
    path: '/',
    access: ['owner'],
    summary: 'Invite a user by e-mail',
    body: inviteUserInput,
    status: 201,
    handler: ({ em, actor, body }) => inviteUser(em, config.PUBLIC_URL, actor, body),
  });
  api.route({
    method: 'patch',
    path: '/:id',
    access: ['owner'],
    summary: 'Change a user’s name, role or disabled flag',
    params: idParams,
    body: updateUserInput,
    handler: ({ em, actor, params, body }) => updateUser(em, actor, params.id, body),
  });
  api.route({
    method: 'post',
    path: '/:id/resend-invite',
    access: ['owner'],
    summary: 'Send a fresh invitation link',
    params: idParams,
    handler: async ({ em, actor, params }): Promise<OkDto> => {
      await resendInvite(em, config.PUBLIC_URL, actor, params.id);
      return { ok: true };
    },
  });
  return api;
}
