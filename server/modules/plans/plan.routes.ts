import type { Readable } from 'node:stream';
import type { Response } from 'express';
import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';
import { hitRateLimit } from '../../lib/rate-limit';
import { STAFF, WORKSHOP } from '@shared/roles';
import { idParams } from '@shared/schemas/common';
import { planAcceptInput, planConvertInput, planDeclineInput, planInput, planRefundInput, planSendInput, planTokenParams, type PublicPlanDto } from '@shared/schemas/plans';
import { createPlan, revisePlan, updatePlan } from './create-plan';
import { getPlan, listBikePlans, listPlanVersions, planPdf } from './read-plans';
import { sendPlan } from './send-plan';
import { acceptPlan, declinePlan } from './respond-plan';
import { refundDeposit, startDepositCheckout } from './deposit';
import { convertPlan } from './convert-plan';
import { findPlan, findPlanByToken, toPlanDto } from './plan-access';
import { handlePaymentEvent, verifyWebhook } from './payment-webhook';

/** The path the provider posts webhooks to; app.ts keeps its body raw (the signature covers the exact bytes). */
export const PAYMENT_WEBHOOK_PATH = '/api/payments/webhook';

/** Plan-link requests allowed per IP address per minute (our own limit, as for report share links). */
const LINK_RATE_RULE = { limit: 60, windowSeconds: 60 };
const ip = (v: string | undefined) => v ?? 'unknown';

async function sendPdf(res: Response, fileName: string, stream: { body: Readable; contentLength?: number }) {
  res.status(200).type('application/pdf');
  res.set('Content-Disposition', `inline; filename="${fileName}"`);
  res.set('Cache-Control', 'private, no-store');
  if (stream.contentLength) res.set('Content-Length', String(stream.contentLength));
  await new Promise<void>((resolve, reject) => {
    stream.body.on('error', reject);
    res.on('finish', () => resolve());
    res.on('close', () => resolve());
    stream.body.pipe(res);
  });
}

/**
 * Build plans. Staff draft, edit, send, convert and refund; the bike's customer (signed in) reads,
 * accepts, declines and pays the deposit; a plan link does the same without an account. The
 * webhook is public and trusts only the provider's signature.
 */
export function planRoutes(deps: AppDeps): ApiRouter[] {
  const bikes = new ApiRouter('/api/bikes', deps);
  bikes.route({ method: 'post', path: '/:id/plans', access: STAFF, status: 201, summary: 'Draft a build plan for a bike', params: idParams, body: planInput, handler: ({ em, actor, params, body }) => createPlan(em, actor, params.id, body) });
  bikes.route({ method: 'get', path: '/:id/plans', access: 'signed-in', summary: 'A bike’s build plans', params: idParams, handler: ({ em, actor, params }) => listBikePlans(em, actor, params.id) });

  const plans = new ApiRouter('/api/plans', deps);
  plans.route({ method: 'get', path: '/:id', access: 'signed-in', summary: 'A build plan', params: idParams, handler: ({ em, actor, params }) => getPlan(em, actor, params.id) });
  plans.route({ method: 'put', path: '/:id', access: STAFF, summary: 'Edit a draft plan', params: idParams, body: planInput, handler: ({ em, actor, params, body }) => updatePlan(em, actor, params.id, body) });
  plans.route({ method: 'post', path: '/:id/revise', access: STAFF, summary: 'Reopen a sent plan as a draft (the next send is a new version)', params: idParams, handler: ({ em, actor, params }) => revisePlan(em, actor, params.id) });
  plans.route({ method: 'get', path: '/:id/versions', access: STAFF, summary: 'Versions sent of a plan', params: idParams, handler: ({ em, actor, params }) => listPlanVersions(em, actor, params.id) });
  plans.route({
    method: 'get', path: '/:id/pdf', access: 'signed-in', stream: true, summary: 'The quote PDF last sent', params: idParams,
    handler: async ({ em, actor, params, res }) => {
      const { fileName, stream } = await planPdf(deps, em, await findPlan(em, actor, params.id));
      await sendPdf(res, fileName, stream);
    },
  });
  plans.route({ method: 'post', path: '/:id/send', access: STAFF, summary: 'E-mail the plan (PDF quote and plan link) as a new version', params: idParams, body: planSendInput, handler: ({ em, actor, params, body }) => sendPlan(deps, em, actor, params.id, body) });
  plans.route({ method: 'post', path: '/:id/accept', access: ['customer'], summary: 'Accept a sent plan with a typed name', params: idParams, body: planAcceptInput, handler: ({ em, actor, params, body, req }) => acceptPlan(em, { actor }, params.id, body.name, ip(req.ip)) });
  plans.route({ method: 'post', path: '/:id/decline', access: ['customer'], summary: 'Decline a sent plan', params: idParams, body: planDeclineInput, handler: ({ em, actor, params, body, req }) => declinePlan(em, { actor }, params.id, body.reason, ip(req.ip)) });
  plans.route({ method: 'post', path: '/:id/deposit', access: ['customer'], summary: 'Start paying the deposit (hosted checkout)', params: idParams, handler: ({ em, actor, params }) => startDepositCheckout(deps, em, { actor }, params.id) });
  plans.route({ method: 'post', path: '/:id/refund', access: ['owner', 'desk'], summary: 'Refund a paid deposit', params: idParams, body: planRefundInput, handler: ({ em, actor, params, body }) => refundDeposit(deps, em, actor, params.id, body.reason) });
  plans.route({ method: 'post', path: '/:id/convert', access: WORKSHOP, summary: 'Turn an accepted plan into the bike’s next stage', params: idParams, body: planConvertInput, handler: ({ em, actor, params, body }) => convertPlan(em, actor, params.id, body) });

  const links = new ApiRouter('/api/plan-links', deps);
  const limited = async (em: Parameters<typeof hitRateLimit>[0], addr: string | undefined) =>
    hitRateLimit(em, `plan-link:${ip(addr)}`, LINK_RATE_RULE, 'Too many requests for plan links from this address; wait a minute and try again.');
  const noStore = { 'Cache-Control': 'no-store', 'X-Robots-Tag': 'noindex' };
  links.route({
    method: 'get', path: '/:token', access: 'public', summary: 'A plan opened from its link', params: planTokenParams, headers: noStore,
    handler: async ({ em, params, req }): Promise<PublicPlanDto> => {
      await limited(em, req.ip);
      const plan = await findPlanByToken(em, params.token);
      return { shopName: plan.shop.name, plan: await toPlanDto(em, plan), pdfUrl: `/api/plan-links/${params.token}/pdf` };
    },
  });
  links.route({
    method: 'get', path: '/:token/pdf', access: 'public', stream: true, summary: 'The quote PDF from a plan link', params: planTokenParams,
    handler: async ({ em, params, req, res }) => {
      await limited(em, req.ip);
      const { fileName, stream } = await planPdf(deps, em, await findPlanByToken(em, params.token));
      await sendPdf(res, fileName, stream);
    },
  });
  links.route({ method: 'post', path: '/:token/accept', access: 'public', summary: 'Accept a plan from its link', params: planTokenParams, body: planAcceptInput, handler: async ({ em, params, body, req }) => (await limited(em, req.ip), acceptPlan(em, { token: params.token }, undefined, body.name, ip(req.ip))) });
  links.route({ method: 'post', path: '/:token/decline', access: 'public', summary: 'Decline a plan from its link', params: planTokenParams, body: planDeclineInput, handler: async ({ em, params, body, req }) => (await limited(em, req.ip), declinePlan(em, { token: params.token }, undefined, body.reason, ip(req.ip))) });
  links.route({ method: 'post', path: '/:token/deposit', access: 'public', summary: 'Start paying the deposit from a plan link', params: planTokenParams, handler: async ({ em, params, req }) => (await limited(em, req.ip), startDepositCheckout(deps, em, { token: params.token })) });

  const payments = new ApiRouter('/api/payments', deps);
  payments.route({
    method: 'post', path: '/webhook', access: 'public', summary: 'Payment provider webhook (signed)',
    handler: async ({ em, req }) => handlePaymentEvent(em, verifyWebhook(deps, req.body as Buffer, req.get('stripe-signature'))),
  });
  return [bikes, plans, links, payments];
}
