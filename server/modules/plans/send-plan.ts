/**
 * Use case: send a plan to the customer. Each send is a new version: the prediction is refreshed,
 * the deposit is fixed from the shop's rule, the quote PDF is stored and mailed with a new plan link
 * (queued in the same transaction as the version row, through the durable mail queue like every
 * other message), and the version row freezes what was sent.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import { z } from 'zod';
import { formatNumber } from '@shared/format';
import { bikeLabel } from '@shared/labels';
import type { PlanSendDto, planSendInput } from '@shared/schemas/plans';
import type { Actor } from '../../http/actor';
import type { AppDeps } from '../../app-deps';
import { AppError } from '../../lib/errors';
import { recordAudit } from '../audit/audit.service';
import { Shop } from '../shops/shop.entity';
import { depositFor } from '../builds/outcome-engine';
import { Plan, PlanVersion } from './plan.entity';
import { findPlan, newPlanToken, requireStatus, toPlanDto } from './plan-access';
import { predictPlan } from './plan-prediction';
import { renderPlanQuote } from './pdf/plan-quote';
import { enqueueMail } from '../../lib/mail/mail-queue';
import { clip, fitSubject } from '../../lib/mail/mail-text';

export const planLinkUrl = (deps: AppDeps, token: string) => `${deps.config.PUBLIC_URL.replace(/\/$/, '')}/plan/${token}`;

export async function sendPlan(deps: AppDeps, em: EntityManager, actor: Actor, id: string, input: z.output<typeof planSendInput>): Promise<PlanSendDto> {
  const plan = await findPlan(em, actor, id);
  requireStatus(plan, ['draft', 'sent', 'expired'], 'sent');
  const to = input.to ?? plan.bike.customer.email;
  if (!to) throw new AppError('VALIDATION_FAILED', 'The customer has no e-mail address on record; enter one to send the plan to.', 400, { fields: [{ path: 'to', message: 'Enter an e-mail address' }] });
  const shop = await em.findOneOrFail(Shop, actor.shopId);
  const prediction = await predictPlan(em, actor.shopId, plan.bike.id, plan.items, plan.totalCostCents);
  const depositCents = depositFor({ mode: shop.depositMode, percent: shop.depositPercent, fixedCents: shop.depositFixedCents }, plan.totalCostCents);
  const version = plan.version + 1;
  const sentAt = new Date();
  const validUntil = new Date(sentAt.getTime() + input.validDays * 86_400_000);
  const { token, hash } = newPlanToken();
  const url = planLinkUrl(deps, token);
  const b = plan.bike;

  const logo = shop.logoKey ? await deps.storage.getBuffer(shop.logoKey).catch(() => null) : null;
  const pdf = await renderPlanQuote(
    {
      shop: { name: shop.name, address: shop.address, phone: shop.phone, email: shop.email, units: shop.units, paperSize: shop.paperSize, timeZone: shop.timeZone },
      customerName: b.customer.name,
      bikeLine: bikeLabel(b),
      bikeDetails: [b.engineFamily, b.displacementCc ? `${formatNumber(b.displacementCc)} cm³` : null, b.vin ? `VIN ${b.vin}` : null].filter(Boolean).join('  ·  '),
      title: plan.title,
      note: plan.note,
      version,
      sentAt,
      validUntil,
      items: plan.items,
      totalCostCents: plan.totalCostCents,
      depositCents,
      currency: plan.currency,
      prediction,
      url,
    },
    logo,
  );
  const pdfKey = `shops/${actor.shopId}/plans/${plan.id}/v${version}.pdf`;
  await deps.storage.put(pdfKey, pdf, { contentType: 'application/pdf' });

  const first = b.customer.name.split(/\s+/)[0] || b.customer.name;
  const text =
    `Hello ${first},\n\nHere is our plan for your ${bikeLabel(b)}: ${plan.title}. The quote is attached as a PDF.\n\n` +
    `Review it, accept it with your name${depositCents ? ' and pay the deposit' : ''} here (open until ${validUntil.toISOString().slice(0, 10)}):\n${url}\n\n` +
    `The expected gain is what similar builds measured in our shop in the past, not a promise.\n\nThank you,\n${shop.name}`;
  await em.transactional(async (tx) => {
    const p = await tx.findOneOrFail(Plan, plan.id);
    Object.assign(p, { status: 'sent', version, sentAt, validUntil, linkTokenHash: hash, depositCents, prediction, updatedAt: sentAt });
    tx.create(PlanVersion, {
      shop: tx.getReference(Shop, actor.shopId),
      plan: p,
      version,
      sentTo: to,
      title: p.title,
      items: p.items,
      totalCostCents: p.totalCostCents,
      depositCents,
      currency: p.currency,
      prediction,
      pdfKey,
    } as PlanVersion);
    await recordAudit(tx, actor, 'plan.send', 'plan', p.id, { version, to, totalCostCents: p.totalCostCents, depositCents });
    await enqueueMail(tx, {
      shopId: actor.shopId,
      kind: 'plan',
      key: `plan:${p.id}:v${version}`,
      to,
      // A 100-character make and model must still give a subject within limits (mail-text.ts).
      subject: fitSubject(`Build plan for your ${clip(bikeLabel(b), 70)} — ${clip(shop.name, 40)}`),
      text,
      fromName: shop.name,
      replyTo: shop.email ?? undefined,
      attachments: [{ filename: `build-plan-v${version}.pdf`, contentType: 'application/pdf', storageKey: pdfKey }],
    });
  });
  em.clear();
  return { plan: await toPlanDto(em, await findPlan(em, actor, id)), to, url };
}
