/** Finding a report the actor may see and its list DTO: shared by the report use cases. */
import { createHash } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { tenantScope } from '../../http/tenant-scope';
import { notFound } from '../../lib/errors';
import type { ReportSummary } from '@shared/schemas/report';
import { bikeLabel } from '../comparisons/engine';
import { Report } from './report.entity';
import { type ReportData, headlineGain } from './report-data';
import { fmtPctChange, fmtPowerGain } from './figures';

export const sha256 = (b: Buffer | string) => createHash('sha256').update(b).digest('hex');
export { bikeLabel };

export const pdfFileName = (r: Report) => `gain-report-${r.number}-v${r.version}.pdf`;

export function toReportDto(r: Report): ReportSummary {
  const data = r.summary as unknown as ReportData | null;
  const head = data?.gains?.length ? headlineGain(data) : null;
  return {
    id: r.id,
    number: r.number,
    version: r.version,
    bikeId: r.bike.id,
    bikeLabel: r.bike.make ? bikeLabel(r.bike) : '',
    comparisonId: r.comparison.id,
    comparisonName: data?.comparison?.name ?? '',
    createdAt: r.createdAt.toISOString(),
    createdByName: r.createdBy?.name ?? null,
    technicianNote: r.technicianNote,
    pdfUrl: `/api/reports/${r.id}/pdf`,
    pdfSha256: r.pdfSha256,
    pdfSizeBytes: r.pdfSizeBytes,
    headline: head && data ? { peakPowerGain: fmtPowerGain(head.peakPowerGain.hp, data.units), areaGain: fmtPctChange(head.areaGainPct) } : null,
  };
}

/** A report the actor may see (customers: their own bikes), else 404. */
export async function findReport(em: EntityManager, actor: Actor, id: string): Promise<Report> {
  const r = await em.findOne(Report, tenantScope<Report>(actor, 'bike.customer', { id }), { populate: ['bike', 'bike.customer', 'comparison', 'createdBy'] });
  if (!r) throw notFound('Report');
  return r;
}
