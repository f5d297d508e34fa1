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
import { bikeLabel, findReport, pdfFileName, sha256 } from './report-access';
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
 * Sends the report and logs the delivery, sent or failed (a failure is logged, then answered
 * MAIL_FAILED with the logged delivery). The log entry and its audit entry commit together.
 */
export async function sendReport(deps: AppDeps, em: EntityManager, actor: Actor, reportId: string, input: SendInput): Promise<Delivery & { shareUrl: string }> {
  const report = await findReport(em, actor, reportId);
  const data = report.summary as unknown as ReportData;
  const share = await createShareLink(deps, em, actor, report.id);
  const subject = `Gain report ${report.number} for your ${bikeLabel(report.bike)} — ${data.shop.name}`;
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
  let outcome: { status: 'sent'; messageId: string } | { status: 'failed'; error: string };
  try {
    const pdf = await deps.storage.getBuffer(report.pdfKey);
    if (sha256(pdf) !== report.pdfSha256) throw new Error('the stored PDF does not match its recorded hash');
    const { messageId } = await deps.mailer.send({ shopId: actor.shopId, to: input.to, subject, text, html, fromName: data.shop.name, replyTo: data.shop.email ?? undefined, attachments: [{ filename: pdfFileName(report), content: pdf, contentType: 'application/pdf' }] });
    outcome = { status: 'sent', messageId };
  } catch (e) {
    outcome = { status: 'failed', error: e instanceof Error ? e.message.slice(0, 2000) : String(e) };
  }
  const dto = await em.transactional(async (tx) => {
    const delivery = tx.create(ReportDelivery, {
      shop: tx.getReference(Shop, actor.shopId),
      report: tx.getReference(Report, report.id),
      to: input.to,
      subject,
      message: input.message,
      status: outcome.status,
      ...(outcome.status === 'sent' ? { messageId: outcome.messageId } : { error: outcome.error }),
      sentBy: tx.getReference(User, actor.id),
    } as ReportDelivery);
    await tx.flush();
    await tx.populate(delivery, ['sentBy']);
    await recordAudit(tx, actor, 'report.send', 'report', report.id, { to: input.to, status: delivery.status });
    return toDeliveryDto(delivery);
  });
  if (dto.status === 'failed') throw new AppError('MAIL_FAILED', `The report could not be sent: ${dto.error}`, 502, { delivery: dto });
  return { ...dto, shareUrl: share.url };
}

export async function listDeliveries(em: EntityManager, actor: Actor, reportId: string): Promise<Delivery[]> {
  const report = await findReport(em, actor, reportId);
  const rows = await em.find(ReportDelivery, { shop: actor.shopId, report: { number: report.number } }, { orderBy: { createdAt: 'desc' }, populate: ['sentBy', 'report'] });
  return rows.map(toDeliveryDto);
}
