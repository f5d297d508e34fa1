/**
 * What a gain report says, as plain data: built once from the comparison when a report version is
 * generated, stored with the version (Report.summary), printed by the PDF and shown by the share
 * page. The shapes live in @shared/schemas/report (the client uses them too).
 */
import type { ReportData, ReportGain } from '@shared/schemas/report';

export type { ReportCost, ReportCurve, ReportData, ReportGain, ReportRun, ReportStage } from '@shared/schemas/report';

/** The gain the headline figures are about: the last run that is not the baseline. */
export function headlineGain(data: Pick<ReportData, 'gains'>): ReportGain | null {
  return data.gains.length ? data.gains[data.gains.length - 1] : null;
}
