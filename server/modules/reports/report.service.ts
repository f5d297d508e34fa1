/**
 * The reports module's use cases, for callers outside it (the demo archive). Each lives in a file
 * of its own: create-report, read-reports, send-report, share-links; the content in report-content.
 */
export { createReport } from './create-report';
export { getReport, listReports, reportPdf } from './read-reports';
export { defaultMessage, listDeliveries, sendReport } from './send-report';
export { SHARE_RATE_RULE, createShareLink, listShareLinks, revokeShareLink, shareNotFound, sharePdf, viewShare } from './share-links';
export { buildReportData } from './report-content';
export { pdfFileName } from './report-access';
export { DEFAULT_SHARE_DAYS } from '@shared/schemas/report';
