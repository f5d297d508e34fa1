/** Use cases: e-mail a report to the customer (PDF attached, a share link in the text) and its send log. */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import type { AppDeps } from '../../app-deps';
import { AppError } from '../../lib/errors';
import type { Delivery, SendInput } from '@shared/schemas/report';
import { Shop } from '../shops/shop.entity';
import { User } from '../users/user.entity';
import { recordAudit } from '../audit/audit.service';
import { Report, ReportDelivery } from './report.entity';
import type { ReportData } from './report-data';
import { bikeLabel, findReport, pdfFileName } from './report-access';
import { enqueueMail } from '../../lib/mail/mail-queue';
import { clip, fitSubject } from '../../lib/mail/mail-text';
import { createShareLink } from './share-links';
import { renderReportEmail } from './report-email';

const toDeliveryDto = (d: ReportDelivery): Delivery => ({
  id: d.id,
  to: d.to,
  subject: d.subject,
  message: d.message,
  status: d.status,
  error: d.error,
  sentByName: d.sentBy?.name ?? null,
  createdAt: d.createdAt.toISOString(),
  reportVersion: d.report.version,
});

export function defaultMessage(data: Pick<ReportData, 'customer' | 'bike' | 'shop'>): string {
  const first = data.customer.name.split(/\s+/)[0] || data.customer.name;
  return `Hello ${first},\n\nHere is the gain report for your ${[data.bike.year, data.bike.make, data.bike.model].filter(Boolean).join(' ')}. The PDF is attached, and the link below shows the figures and chart online.\n\nThank you,\n${data.shop.name}`;
}

/**
 * Sends the report: the delivery row, its share link, its audit entry and the queued mail commit
 * together, then the mail is tried at once. Sent → 201; the relay refused it for good → the
 * delivery is logged failed, the share link removed, and MAIL_FAILED answered; the relay is away →
 * 202 with the delivery `queued`, and the mail queue keeps trying (the log follows).
 */
export async function sendReport(deps: AppDeps, em: EntityManager, actor: Actor, reportId: string, input: SendInput): Promise<Delivery & { shareUrl: string }> {
  const report = await findReport(em, actor, reportId);
  const data = report.summary as unknown as ReportData;
  // A 100-character make and model must still give a subject within limits (mail-text.ts).
  const subject = fitSubject(`Gain report ${report.number} for your ${clip(bikeLabel(report.bike), 70)} — ${clip(data.shop.name, 40)}`);
  const { deliveryId, mailId, shareUrl } = await em.transactional(async (tx) => {
    const share = await createShareLink(deps, tx, actor, report.id);
    // HTML with a plain-text part, greeting the customer and signed by the shop (report-email.tsx).
    const { html, text } = await renderReportEmail({
      shop: data.shop,
      customerName: data.customer.name,
      reportNumber: report.number,
      bikeLabel: bikeLabel(report.bike),
      message: input.message,
      shareUrl: share.url,
      linkValidUntil: share.expiresAt.slice(0, 10),
    });
    const delivery = tx.create(ReportDelivery, {
      shop: tx.getReference(Shop, actor.shopId),
      report: tx.getReference(Report, report.id),
      to: input.to,
      subject,
      message: input.message,
      status: 'queued',
      sentBy: tx.getReference(User, actor.id),
    } as ReportDelivery);
    await tx.flush();
    const mail = await enqueueMail(
      tx,
      {
        shopId: actor.shopId,
        kind: 'report',
        to: input.to,
        subject,
        text,
        html,
        fromName: data.shop.name,
        replyTo: data.shop.email ?? undefined,
        attachments: [{ filename: pdfFileName(report), contentType: 'application/pdf', storageKey: report.pdfKey, sha256: report.pdfSha256 }],
        shareLinkId: share.id,
        reportDeliveryId: delivery.id,
      },
      { dispatch: false },
    );
    await recordAudit(tx, actor, 'report.send', 'report', report.id, { to: input.to, status: 'queued' });
    return { deliveryId: delivery.id, mailId: mail.id, shareUrl: share.url };
  });
  const outcome = await deps.mail.deliverNow(mailId);
  const row = await em.fork().findOneOrFail(ReportDelivery, deliveryId, { populate: ['sentBy', 'report'] });
  const dto = toDeliveryDto(row);
  if (outcome === 'failed') throw new AppError('MAIL_FAILED', `The report could not be sent: ${dto.error ?? 'the relay refused it'}`, 502, { delivery: dto });
  return { ...dto, shareUrl };
}

export async function listDeliveries(em: EntityManager, actor: Actor, reportId: string): Promise<Delivery[]> {
  const report = await findReport(em, actor, reportId);
  const rows = await em.find(ReportDelivery, { shop: actor.shopId, report: { number: report.number } }, { orderBy: { createdAt: 'desc' }, populate: ['sentBy', 'report'] });
  return rows.map(toDeliveryDto);
}
