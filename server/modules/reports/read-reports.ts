/** Use cases: list reports, one report with its versions, a version's stored PDF. */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import type { AppDeps } from '../../app-deps';
import type { ReportDetail } from '@shared/schemas/report';
import { Report } from './report.entity';
import type { ReportData } from './report-data';
import { findReport, toReportDto } from './report-access';

export { listReports } from './list-reports';

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
