import multer from 'multer';
import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';
import { STAFF } from '@shared/roles';
import { LOGO_MAX_BYTES } from './logo-image';
import { removeShopLogo, shopLogo, uploadShopLogo } from './shop-logo';

/** The shop logo printed on gain reports: upload and remove (owner), view (staff). */
export function shopLogoRoutes(deps: AppDeps): ApiRouter {
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
    handler: ({ em, actor, req }) => uploadShopLogo(deps, em, actor, req.file),
  });
  logo.route({
    method: 'get',
    path: '/',
    access: STAFF,
    summary: 'The shop logo image',
    stream: true,
    handler: async ({ em, actor, res }) => {
      const { body, contentType } = await shopLogo(deps, em, actor);
      res.status(200).type(contentType ?? 'application/octet-stream');
      res.set('Cache-Control', 'private, max-age=60');
      await new Promise<void>((resolve, reject) => {
        body.on('error', reject);
        res.on('close', () => resolve());
        body.pipe(res);
      });
    },
  });
  logo.route({ method: 'delete', path: '/', access: ['owner'], summary: 'Remove the shop logo', handler: ({ em, actor }) => removeShopLogo(deps, em, actor) });
  return logo;
}
