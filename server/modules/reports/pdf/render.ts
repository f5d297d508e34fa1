/** Renders a gain report to PDF bytes (server-side, @react-pdf/renderer). */
import { createElement } from 'react';
import { renderToBuffer } from '@react-pdf/renderer';
import type { ReportData } from '../report-data';
import { GainReportDocument, type ReportLogo } from './gain-report';
import { registerReportFonts } from './fonts';
import { imageFormatOf } from '../../shops/logo-image';

export { imageFormatOf };

export async function renderReportPdf(data: ReportData, logo?: Buffer | null): Promise<Buffer> {
  registerReportFonts();
  const format = logo ? imageFormatOf(logo) : null;
  const logoProp: ReportLogo | null = logo && format ? { data: logo, format } : null;
  // renderToBuffer's type wants a <Document> element; GainReportDocument returns one.
  const element = createElement(GainReportDocument, { data, logo: logoProp }) as unknown as Parameters<typeof renderToBuffer>[0];
  return renderToBuffer(element);
}
