/** Renders a gain report to PDF bytes (server-side, @react-pdf/renderer). */
import { createElement } from 'react';
import { renderToBuffer } from '@react-pdf/renderer';
import type { ReportData } from '../report-data';
import { GainReportDocument, type ReportLogo } from './gain-report';
import { registerReportFonts } from './fonts';
import { readImageHeader, withinImageLimits } from '../../../lib/image-guard';

export async function renderReportPdf(data: ReportData, logo?: Buffer | null): Promise<Buffer> {
  registerReportFonts();
  // A logo stored before the size rule, or one that is not an image, is left out rather than decoded.
  const header = logo ? readImageHeader(logo) : null;
  const logoProp: ReportLogo | null = logo && header && withinImageLimits(header) ? { data: logo, format: header.format } : null;
  // renderToBuffer's type wants a <Document> element; GainReportDocument returns one.
  const element = createElement(GainReportDocument, { data, logo: logoProp }) as unknown as Parameters<typeof renderToBuffer>[0];
  return renderToBuffer(element);
}
