import { z } from 'zod';
import type { Response } from 'express';
import type { Readable } from 'node:stream';
import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';
import { STAFF } from '@shared/roles';
import { idParams, uuid, wholePage } from '@shared/schemas/common';
import { reportInput, reportListQuery, sendInput, shareInput } from '@shared/schemas/report';
import type { Report } from './report.entity';
import { createReport } from './create-report';
import { getReport, listReports, reportPdf } from './read-reports';
import { listDeliveries, sendReport } from './send-report';
import { createShareLink, listShareLinks, revokeShareLink, sharePdf, viewShare } from './share-links';
import { pdfFileName } from './report-access';

const SENDERS = ['owner', 'desk', 'tuner'] as const;

export { reportInput, reportListQuery, sendInput, shareInput };
const shareParams = z.object({ id: uuid, shareId: uuid });
const tokenParams = z.object({ token: z.string().max(200) });

async function sendPdf(res: Response, report: Report, stream: { body: Readable; contentLength?: number }, disposition: 'inline' | 'attachment') {
  res.status(200);
  res.type('application/pdf');
  res.set('Content-Disposition', `${disposition}; filename="${pdfFileName(report)}"`);
  res.set('Cache-Control', 'private, max-age=300');
  if (stream.contentLength) res.set('Content-Length', String(stream.contentLength));
  await new Promise<void>((resolve, reject) => {
    stream.body.on('error', reject);
    res.on('finish', () => resolve());
    res.on('close', () => resolve());
    stream.body.pipe(res);
  });
}

const clientIp = (ip: string | undefined) => ip ?? 'unknown';

/** Routes of the reports domain: reports and the public share link API (the shop logo is in ../shops). */
export function reportRoutes(deps: AppDeps): ApiRouter[] {
  const api = new ApiRouter('/api/reports', deps);
  api.route({ method: 'post', path: '/', access: STAFF, summary: 'Generate a gain report (a new version when the comparison already has one)', body: reportInput, status: 201, handler: ({ em, actor, body }) => createReport(deps, em, actor, body) });
  api.route({ method: 'get', path: '/', access: 'signed-in', summary: 'Reports, optionally of one bike (customers: their own bikes)', query: reportListQuery, handler: async ({ em, actor, query }) => wholePage(await listReports(em, actor, query)) });
  api.route({ method: 'get', path: '/:id', access: 'signed-in', summary: 'One report with its versions', params: idParams, handler: ({ em, actor, params }) => getReport(em, actor, params.id) });
  api.route({
    method: 'get',
    path: '/:id/pdf',
    access: 'signed-in',
    summary: 'The stored PDF of a report version',
    params: idParams,
    query: z.object({ download: z.string().optional() }),
    stream: true,
    handler: async ({ em, actor, params, query, res }) => {
      const { report, stream } = await reportPdf(deps, em, actor, params.id);
      await sendPdf(res, report, stream, query.download ? 'attachment' : 'inline');
    },
  });
  api.route({ method: 'post', path: '/:id/send', access: SENDERS, summary: 'E-mail a report to the customer (PDF attached, share link included)', params: idParams, body: sendInput, status: 201, handler: ({ em, actor, params, body }) => sendReport(deps, em, actor, params.id, body) });
  api.route({ method: 'get', path: '/:id/deliveries', access: STAFF, summary: 'Send log of a report', params: idParams, handler: async ({ em, actor, params }) => wholePage(await listDeliveries(em, actor, params.id)) });
  api.route({ method: 'post', path: '/:id/share', access: STAFF, summary: 'Create a share link', params: idParams, body: shareInput, status: 201, handler: ({ em, actor, params, body }) => createShareLink(deps, em, actor, params.id, body.expiresInDays) });
  api.route({ method: 'get', path: '/:id/share', access: STAFF, summary: 'Share links of a report with view counts', params: idParams, handler: async ({ em, actor, params }) => wholePage(await listShareLinks(em, actor, params.id)) });
  api.route({ method: 'delete', path: '/:id/share/:shareId', access: STAFF, summary: 'Revoke a share link', params: shareParams, handler: ({ em, actor, params }) => revokeShareLink(em, actor, params.id, params.shareId) });

  const share = new ApiRouter('/api/share', deps);
  share.route({ method: 'get', path: '/:token', access: 'public', summary: 'A shared report’s summary and chart data', params: tokenParams, headers: { 'Cache-Control': 'no-store', 'X-Robots-Tag': 'noindex' }, handler: ({ em, params, req }) => viewShare(em, params.token, clientIp(req.ip)) });
  share.route({
    method: 'get',
    path: '/:token/pdf',
    access: 'public',
    summary: 'A shared report’s PDF',
    params: tokenParams,
    stream: true,
    headers: { 'X-Robots-Tag': 'noindex' },
    handler: async ({ em, params, req, res }) => {
      const { report, stream } = await sharePdf(deps, em, params.token, clientIp(req.ip));
      await sendPdf(res, report, stream, 'attachment');
    },
  });

  return [api, share];
}
