/** Shapes of the reports API (server/modules/reports), shared with the server. Power and torque are hp and lb·ft. */
export type {
  Delivery,
  PublicShare,
  ReportCurve as ReportCurveView,
  ReportDetail,
  ReportGain as ReportGainView,
  ReportSummary,
  ReportUnits as Units,
  ShareLinkView,
} from '@shared/schemas/report';
export type { PublicShareRun as ReportRunView } from '@shared/schemas/report';
