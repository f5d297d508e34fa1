import { z } from 'zod';
import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';
import { WORKSHOP } from '@shared/roles';
import { idParams, uuid } from '@shared/schemas/common';
import { safetyCheckInput, sessionInput, sessionUpdateInput } from '@shared/schemas/run';
import { streamSessionEvents } from './session-events';
import { confirmSafety, createSession, listSessions, sessionWithRuns, updateSession } from './session.service';

/** Dyno sessions: one visit of a bike, with its conditions and the safety checklist. */
export function sessionRoutes(deps: AppDeps): ApiRouter[] {
  const api = new ApiRouter('/api/sessions', deps);
  api.route({ method: 'get', path: '/', access: 'signed-in', summary: 'Sessions (of a bike with ?bikeId)', query: z.object({ bikeId: uuid.optional() }), handler: ({ em, actor, query }) => listSessions(em, actor, query) });
  api.route({ method: 'post', path: '/', access: WORKSHOP, summary: 'Start a session', body: sessionInput, status: 201, handler: ({ em, actor, body }) => createSession(em, actor, body) });
  api.route({ method: 'get', path: '/:id', access: 'signed-in', summary: 'One session with its runs', params: idParams, handler: ({ em, actor, params }) => sessionWithRuns(em, actor, params.id) });
  api.route({ method: 'patch', path: '/:id', access: WORKSHOP, summary: 'Edit a session', params: idParams, body: sessionUpdateInput, handler: ({ em, actor, params, body }) => updateSession(em, actor, params.id, body) });
  api.route({ method: 'post', path: '/:id/safety-check', access: WORKSHOP, summary: 'Confirm the dyno-bay safety checklist', params: idParams, body: safetyCheckInput, handler: ({ em, actor, params, body }) => confirmSafety(em, actor, params.id, body) });
  api.route({ method: 'get', path: '/:id/events', access: 'signed-in', summary: 'Live run events of a session (Server-Sent Events)', params: idParams, stream: true, handler: ({ em, actor, params, deps: d, req, res }) => streamSessionEvents({ em, actor, deps: d, req, res, sessionId: params.id }) });
  return [api];
}
