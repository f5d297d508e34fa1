import { z } from 'zod';
import multer from 'multer';
import { randomUUID } from 'node:crypto';
import type { Response } from 'express';
import type { Readable } from 'node:stream';
import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';
import { STAFF } from '@shared/roles';
import { idParams, uuid } from '@shared/schemas/common';
import { reportInput, reportListQuery, sendInput, shareInput } from '@shared/schemas/report';
import { AppError } from '../../lib/errors';
import { Shop } from '../shops/shop.entity';
import { recordAudit } from '../audit/audit.service';
import type { Report } from './report.entity';
import {
  createReport,
  createShareLink,
  getReport,
  listDeliveries,
  listReports,
  listShareLinks,
  pdfFileName,
  reportPdf,
  revokeShareLink,
  sendReport,
  sharePdf,
  viewShare,
} from './report.service';
import { imageFormatOf } from './pdf/render';

const SENDERS = ['owner', 'desk', 'tuner'] as const;
export const LOGO_MAX_BYTES = 2 * 1024 * 1024;

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

/** Routes of the reports domain: reports, the public share link API and the shop logo. */
export function reportRoutes(deps: AppDeps): ApiRouter[] {
  const api = new ApiRouter('/api/reports', deps);
  api.route({ method: 'post', path: '/', access: STAFF, summary: 'Generate a gain report (a new version when the comparison already has one)', body: reportInput, status: 201, handler: ({ em, actor, body }) => createReport(deps, em, actor, body) });
  api.route({ method: 'get', path: '/', access: 'signed-in', summary: 'Reports, optionally of one bike (customers: their own bikes)', query: reportListQuery, handler: ({ em, actor, query }) => listReports(em, actor, query) });
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
  api.route({ method: 'get', path: '/:id/deliveries', access: STAFF, summary: 'Send log of a report', params: idParams, handler: ({ em, actor, params }) => listDeliveries(em, actor, params.id) });
  api.route({ method: 'post', path: '/:id/share', access: STAFF, summary: 'Create a share link', params: idParams, body: shareInput, status: 201, handler: ({ em, actor, params, body }) => createShareLink(deps, em, actor, params.id, body.expiresInDays) });
  api.route({ method: 'get', path: '/:id/share', access: STAFF, summary: 'Share links of a report with view counts', params: idParams, handler: ({ em, actor, params }) => listShareLinks(em, actor, params.id) });
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

  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: LOGO_MAX_BYTES, files: 1, fields: 5 } }).single('logo');
  const logo = new ApiRouter('/api/shop-logo', deps);
  logo.route({
    method: 'post',
    path: '/',
    access: ['owner'],
    summary: 'Upload the shop logo shown on reports (PNG or JPEG, at most 2 MB)',
    before: [
      (_req, res, next) => {
        res.locals.uploadLimitText = '2 MB';
        next();
      },
      upload,
    ],
    handler: async ({ em, actor, req }) => {
      const file = req.file;
      if (!file) throw new AppError('FILE_REQUIRED', 'Choose a PNG or JPEG image to upload (form field "logo")', 400);
      const format = imageFormatOf(file.buffer);
      if (!format) throw new AppError('UNSUPPORTED_IMAGE', 'The logo must be a PNG or JPEG image', 415);
      const shop = await em.findOneOrFail(Shop, actor.shopId);
      const key = `shops/${actor.shopId}/logo/${randomUUID()}.${format === 'png' ? 'png' : 'jpg'}`;
      await deps.storage.put(key, file.buffer, { contentType: format === 'png' ? 'image/png' : 'image/jpeg' });
      const old = shop.logoKey;
      shop.logoKey = key;
      await em.flush();
      if (old) await deps.storage.delete(old).catch(() => undefined);
      await recordAudit(em, actor, 'shop.logo', 'shop', shop.id, { bytes: file.size, format });
      return { hasLogo: true, format, sizeBytes: file.size, url: '/api/shop-logo' };
    },
  });
  logo.route({
    method: 'get',
    path: '/',
    access: STAFF,
    summary: 'The shop logo image',
    stream: true,
    handler: async ({ em, actor, res }) => {
      const shop = await em.findOneOrFail(Shop, actor.shopId);
      if (!shop.logoKey) throw new AppError('NOT_FOUND', 'This shop has no logo yet', 404);
      const { body, contentType } = await deps.storage.getStream(shop.logoKey);
      res.status(200).type(contentType ?? 'application/octet-stream');
      res.set('Cache-Control', 'private, max-age=60');
      await new Promise<void>((resolve, reject) => {
        body.on('error', reject);
        res.on('close', () => resolve());
        body.pipe(res);
      });
    },
  });
  logo.route({
    method: 'delete',
    path: '/',
    access: ['owner'],
    summary: 'Remove the shop logo',
    handler: async ({ em, actor }) => {
      const shop = await em.findOneOrFail(Shop, actor.shopId);
      const old = shop.logoKey;
      shop.logoKey = null;
      await em.flush();
      if (old) await deps.storage.delete(old).catch(() => undefined);
      await recordAudit(em, actor, 'shop.logo.remove', 'shop', shop.id, {});
    },
  });

  return [api, share, logo];
}
