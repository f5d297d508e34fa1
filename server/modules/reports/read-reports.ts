/** Use cases: list reports, one report with its versions, a version's stored PDF. */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { FilterQuery } from '@mikro-orm/core';
import type { Actor } from '../../http/actor';
import type { AppDeps } from '../../app-deps';
import { tenantScope } from '../../http/tenant-scope';
import type { ReportDetail, ReportSummary } from '@shared/schemas/report';
import { Report } from './report.entity';
import type { ReportData } from './report-data';
import { findReport, toReportDto } from './report-access';

export async function listReports(em: EntityManager, actor: Actor, query: { bikeId?: string; comparisonId?: string }): Promise<ReportSummary[]> {
  const where = tenantScope<Report>(actor, 'bike.customer') as Record<string, unknown>;
  if (query.bikeId) where.bike = { ...((where.bike as object | undefined) ?? {}), id: query.bikeId };
  if (query.comparisonId) where.comparison = query.comparisonId;
  const rows = await em.find(Report, where as FilterQuery<Report>, { populate: ['bike', 'comparison', 'createdBy'], orderBy: [{ createdAt: 'desc' }, { version: 'desc' }], limit: 500 });
  return rows.map(toReportDto);
}

export async function getReport(em: EntityManager, actor: Actor, id: string): Promise<ReportDetail> {
  const r = await findReport(em, actor, id);
  const versions = await em.find(Report, { shop: actor.shopId, number: r.number }, { orderBy: { version: 'desc' }, populate: ['bike', 'comparison', 'createdBy'] });
  const customer = r.bike.customer;
  return {
    ...toReportDto(r),
    customer: { id: customer.id, name: customer.name, email: actor.role === 'customer' ? null : customer.email },
    data: r.summary as unknown as ReportData,
    versions: versions.map(toReportDto),
  };
}

export async function reportPdf(deps: AppDeps, em: EntityManager, actor: Actor, id: string) {
  const r = await findReport(em, actor, id);
  return { report: r, stream: await deps.storage.getStream(r.pdfKey) };
}
