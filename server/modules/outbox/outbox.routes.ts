import { z } from 'zod';
import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';
import { AppError } from '../../lib/errors';
import { wholePage } from '@shared/schemas/common';
import type { CapturedMessageDetail, MailLogEntry, OutboxPage } from '@shared/schemas/outbox';
import type { Page, OkDto } from '@shared/schemas/common';

const messageParams = z.object({ id: z.string().regex(/^[\w.-]+\.eml$/, 'Not a message id') });

/** The local SMTP fake's captured mail, for demonstrating e-mail flows without a real relay. */
export function outboxRoutes(deps: AppDeps) {
  const api = new ApiRouter('/api/outbox', deps);
  api.route({
    method: 'get',
    path: '/',
    access: ['owner'],
    summary: 'Messages captured by the local mail fake',
    handler: async ({ actor }): Promise<OutboxPage> => ({ enabled: deps.outbox.enabled, ...wholePage(deps.outbox.enabled ? await deps.outbox.list(actor.shopId) : []) }),
  });
  api.route({
    method: 'get',
    path: '/log',
    access: ['owner'],
    summary: 'The send log: every message queued for the shop, queued, sent or failed',
    handler: async ({ actor }): Promise<Page<MailLogEntry>> => wholePage(await deps.mail.list(actor.shopId)),
  });
  api.route({
    method: 'post',
    path: '/log/:id/retry',
    access: ['owner'],
    summary: 'Queue a failed message again, or try a queued one now',
    params: z.object({ id: z.string().uuid() }),
    handler: async ({ actor, params }): Promise<OkDto> => {
      if (!(await deps.mail.retry(actor.shopId, params.id))) throw new AppError('NOT_FOUND', 'No message to retry: it was sent, or it is a report e-mail (send the report again)', 404);
      return { ok: true };
    },
  });
  api.route({
    method: 'get',
    path: '/:id',
    access: ['owner'],
    summary: 'One captured message',
    params: messageParams,
    handler: async ({ actor, params }): Promise<CapturedMessageDetail> => {
      const { raw: _raw, parsed, ...msg } = await deps.outbox.get(actor.shopId, params.id);
      return { ...msg, html: typeof parsed.html === 'string' ? parsed.html : null };
    },
  });
  api.route({
    method: 'get',
    path: '/:id/attachments/:index',
    access: ['owner'],
    summary: 'Download an attachment of a captured message',
    stream: true,
    params: messageParams.extend({ index: z.coerce.number().int().min(0) }),
    handler: async ({ actor, params, res }) => {
      const { parsed } = await deps.outbox.get(actor.shopId, params.id);
      const att = parsed.attachments[params.index];
      if (!att) throw new AppError('NOT_FOUND', 'Attachment not found', 404);
      res.type(att.contentType).attachment(att.filename ?? 'attachment').send(att.content);
    },
  });
  return api;
}
