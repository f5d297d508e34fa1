/**
 * Use cases: the deposit of an accepted plan. The customer gets a hosted checkout page from the
 * payment provider; payment is confirmed only by the provider's signed webhook (payment-webhook.ts).
 * Staff refund a paid deposit through the provider when the work is declined or cancelled.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { DepositCheckoutDto, PlanDto } from '@shared/schemas/plans';
import { bikeLabel } from '@shared/labels';
import type { Actor } from '../../http/actor';
import type { AppDeps } from '../../app-deps';
import { AppError } from '../../lib/errors';
import { recordAudit } from '../audit/audit.service';
import { Plan } from './plan.entity';
import { findPlan, requireStatus, toPlanDto } from './plan-access';
import { viewerPlan, type PlanViewer } from './respond-plan';
import { callProvider, paymentClient } from './payment-provider';

/** Where the customer returns after paying: the plan link, or the portal's plan page. */
function returnUrl(deps: AppDeps, viewer: PlanViewer, plan: Plan) {
  const base = deps.config.PUBLIC_URL.replace(/\/$/, '');
  return 'token' in viewer ? `${base}/plan/${viewer.token}` : `${base}/plans/${plan.id}`;
}

export async function startDepositCheckout(deps: AppDeps, em: EntityManager, viewer: PlanViewer, id?: string): Promise<DepositCheckoutDto> {
  const plan = await viewerPlan(em, viewer, id);
  requireStatus(plan, ['accepted'], 'paid for before it is accepted');
  const due = plan.depositCents - plan.depositPaidCents;
  if (due <= 0) throw new AppError('DEPOSIT_NOT_DUE', plan.depositCents ? 'The deposit is already paid.' : 'This plan asks no deposit.', 409);
  const stripe = paymentClient(deps.config);
  const back = returnUrl(deps, viewer, plan);
  const session = await callProvider('start the checkout', () =>
    stripe.checkout.sessions.create({
      mode: 'payment',
      line_items: [{ quantity: 1, price_data: { currency: plan.currency, unit_amount: due, product_data: { name: `Deposit: ${plan.title} (${bikeLabel(plan.bike)})` } } }],
      success_url: `${back}?deposit=paid`,
      cancel_url: back,
      client_reference_id: plan.id,
      customer_email: plan.bike.customer.email ?? undefined,
      metadata: { planId: plan.id, shopId: plan.shop.id, planVersion: String(plan.version) },
    }),
  );
  if (!session.url) throw new AppError('PAYMENTS_UNAVAILABLE', 'The payment service gave no checkout page.', 502);
  await em.nativeUpdate(Plan, { id: plan.id }, { checkoutSessionId: session.id });
  return { url: session.url };
}

/** Refund what was paid and not yet refunded (staff; e.g. the customer withdrew before parts were ordered). */
export async function refundDeposit(deps: AppDeps, em: EntityManager, actor: Actor, id: string, reason: string | null): Promise<PlanDto> {
  const plan = await findPlan(em, actor, id);
  requireStatus(plan, ['accepted', 'declined', 'expired'], 'refunded (a converted plan is work done)');
  const refundable = plan.depositPaidCents - plan.depositRefundedCents;
  if (refundable <= 0 || !plan.paymentIntentId) throw new AppError('DEPOSIT_NOT_DUE', 'There is no paid deposit left to refund.', 409);
  const stripe = paymentClient(deps.config);
  const refund = await callProvider('refund the deposit', () =>
    stripe.refunds.create({ payment_intent: plan.paymentIntentId!, amount: refundable, metadata: { planId: plan.id } }, { idempotencyKey: `plan-refund-${plan.id}-${plan.depositRefundedCents}` }),
  );
  await em.transactional(async (tx) => {
    const p = await tx.findOneOrFail(Plan, plan.id);
    p.depositRefundedCents += refund.amount;
    // Refunding an accepted plan withdraws it: the work will not go ahead.
    if (p.status === 'accepted') Object.assign(p, { status: 'declined', declinedAt: new Date(), declineReason: reason ?? 'Deposit refunded by the shop' });
    p.updatedAt = new Date();
    await recordAudit(tx, actor, 'plan.refund', 'plan', p.id, { amountCents: refund.amount, currency: refund.currency, refundId: refund.id, reason });
  });
  em.clear();
  return toPlanDto(em, await findPlan(em, actor, id));
}
