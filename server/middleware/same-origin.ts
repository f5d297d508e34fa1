import type express from 'express';
import { AppError } from '../lib/errors';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Refuse state-changing requests that a browser made on behalf of another site. Browsers send
 * Sec-Fetch-Site and Origin on such requests; a non-browser client that sends neither, or sends
 * an Origin equal to ours, is let through (it holds no victim's cookie).
 */
export function sameOriginOnly(publicUrl: string): express.RequestHandler {
  const allowed = new URL(publicUrl).origin;
  return (req, _res, next) => {
    if (SAFE.has(req.method)) return next();
    const site = req.get('sec-fetch-site');
    if (site && site !== 'same-origin' && site !== 'none') {
      return next(new AppError('CROSS_ORIGIN', 'Requests from another site are refused', 403));
    }
    const origin = req.get('origin');
    if (origin && origin !== 'null') {
      const ownHost = `${req.protocol}://${req.get('host')}`;
      if (origin !== allowed && origin !== ownHost) {
        return next(new AppError('CROSS_ORIGIN', 'Requests from another site are refused', 403));
      }
    } else if (origin === 'null') {
      return next(new AppError('CROSS_ORIGIN', 'Requests from another site are refused', 403));
    }
    next();
  };
}
