/** Renders a gain report to PDF bytes (server-side, @react-pdf/renderer). */
import { createElement } from 'react';
import { renderToBuffer } from '@react-pdf/renderer';
import type { ReportData } from '../report-data';
import { GainReportDocument, type ReportLogo } from './gain-report';
import { registerReportFonts } from './fonts';

/** PNG and JPEG are told apart by their magic bytes (PNG: 89 50 4E 47 0D 0A 1A 0A; JPEG: FF D8 FF). */
export function imageFormatOf(bytes: Buffer): 'png' | 'jpg' | null {
  if (bytes.length >= 8 && bytes.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))) return 'png';
  if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) return 'jpg';
  return null;
}

export async function renderReportPdf(data: ReportData, logo?: Buffer | null): Promise<Buffer> {
  registerReportFonts();
  const format = logo ? imageFormatOf(logo) : null;
  const logoProp: ReportLogo | null = logo && format ? { data: logo, format } : null;
  // renderToBuffer's type wants a <Document> element; GainReportDocument returns one.
  const element = createElement(GainReportDocument, { data, logo: logoProp }) as unknown as Parameters<typeof renderToBuffer>[0];
  return renderToBuffer(element);
}
