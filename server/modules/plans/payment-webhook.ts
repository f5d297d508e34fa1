/**
 * Use case: the payment provider's webhook. The only thing that marks a deposit paid.
 *
 * - The signature is verified with the SDK's own `webhooks.constructEvent` on the raw body (a
 *   tampered body, a wrong secret or a stale timestamp is refused with 400 and changes nothing).
 * - Each event id is stored; a replayed or duplicated event is answered 200 and ignored.
 * - A completed checkout counts only when it is paid, names a plan and that plan's shop in the
 *   metadata we set when starting it, and its amount and currency equal what is due on the plan.
 */
import { LockMode } from '@mikro-orm/core';
import type { EntityManager } from '@mikro-orm/postgresql';
import type Stripe from 'stripe';
import type { AppDeps } from '../../app-deps';
import { AppError } from '../../lib/errors';
import { logger } from '../../lib/logger';
import { AuditEntry } from '../audit/audit-entry.entity';
import { Shop } from '../shops/shop.entity';
import { PaymentEvent, Plan } from './plan.entity';
import { paymentClient } from './payment-provider';

export type WebhookOutcome = 'paid' | 'duplicate' | 'ignored' | 'amount-mismatch' | 'unknown-plan' | 'not-paid' | 'already-paid';

export function verifyWebhook(deps: AppDeps, rawBody: Buffer | undefined, signature: string | undefined): Stripe.Event {
  const secret = deps.config.PAYMENTS_WEBHOOK_SECRET;
  if (!secret) throw new AppError('PAYMENTS_UNAVAILABLE', 'Webhooks are not configured', 503);
  if (!Buffer.isBuffer(rawBody) || !signature) throw new AppError('WEBHOOK_INVALID', 'Missing body or signature', 400);
  try {
    return paymentClient(deps.config).webhooks.constructEvent(rawBody, signature, secret);
  } catch (e) {
    throw new AppError('WEBHOOK_INVALID', `Webhook refused: ${e instanceof Error ? e.message : 'bad signature'}`, 400);
  }
}

export async function handlePaymentEvent(em: EntityManager, event: Stripe.Event): Promise<{ received: true; outcome: WebhookOutcome }> {
  return em.transactional(async (tx) => {
    // The event id is the key: a second delivery of the same event stops here.
    const inserted = (await tx.getConnection().execute(
      `insert into payment_event (event_id, type, outcome, received_at) values (?, ?, 'processing', now()) on conflict (event_id) do nothing returning event_id`,
      [event.id, event.type], 'all', tx.getTransactionContext(),
    )) as unknown[];
    if (!inserted.length) return { received: true as const, outcome: 'duplicate' as const };

    let outcome: WebhookOutcome = 'ignored';
    let plan: Plan | null = null;
    if (event.type === 'checkout.session.completed') {
      const s = event.data.object as Stripe.Checkout.Session;
      const planId = s.metadata?.planId ?? s.client_reference_id;
      plan = planId && /^[0-9a-f-]{36}$/i.test(planId) ? await tx.findOne(Plan, { id: planId }, { lockMode: LockMode.PESSIMISTIC_WRITE }) : null;
      // Our own metadata on a signed event: the plan and its shop must both match.
      if (!plan || s.metadata?.shopId !== plan.shop.id) outcome = 'unknown-plan';
      else if (s.payment_status !== 'paid') outcome = 'not-paid';
      else if (plan.depositPaidCents >= plan.depositCents) outcome = 'already-paid';
      else if (s.amount_total !== plan.depositCents - plan.depositPaidCents || (s.currency ?? '').toLowerCase() !== plan.currency.toLowerCase()) outcome = 'amount-mismatch';
      else {
        plan.depositPaidCents += s.amount_total;
        plan.paymentIntentId = typeof s.payment_intent === 'string' ? s.payment_intent : (s.payment_intent?.id ?? null);
        plan.updatedAt = new Date();
        outcome = 'paid';
        tx.create(AuditEntry, {
          shop: tx.getReference(Shop, plan.shop.id),
          user: null,
          action: 'plan.deposit',
          entityType: 'plan',
          entityId: plan.id,
          details: { amountCents: s.amount_total, currency: s.currency, eventId: event.id, checkoutSessionId: s.id, via: 'payment provider' },
        } as unknown as AuditEntry);
      }
      if (outcome !== 'paid') logger.warn({ eventId: event.id, outcome, planId }, 'payment webhook changed nothing');
    }
    await tx.nativeUpdate(PaymentEvent, { eventId: event.id }, { outcome, plan: plan?.id ?? null });
    return { received: true as const, outcome };
  });
}
