import type express from 'express';
import { NotFoundError } from '@mikro-orm/core';
import multer from 'multer';
import type { ApiErrorBody, ApiErrorCode } from '@shared/errors';
import { AppError } from '../lib/errors';
import { logger, safeUrl } from '../lib/logger';
import { isDatabaseUnavailable } from '../lib/db-errors';

/** Turns every failure into `{ error: { code, message, details } }`; internals never leak. */
export function errorHandler(): express.ErrorRequestHandler {
  return (err, req, res, _next) => {
    let appError: AppError;
    if (err instanceof AppError) appError = err;
    else if (err instanceof NotFoundError) appError = new AppError('NOT_FOUND', 'Not found', 404);
    else if (err instanceof multer.MulterError) {
      const tooBig = err.code === 'LIMIT_FILE_SIZE' || err.code === 'LIMIT_FILE_COUNT' || err.code === 'LIMIT_FIELD_VALUE';
      const message =
        err.code === 'LIMIT_FILE_SIZE'
          ? `A file is larger than the limit${res.locals.uploadLimitText ? ` (${res.locals.uploadLimitText})` : ''}; nothing was saved`
          : err.code === 'LIMIT_FILE_COUNT'
            ? `Too many files in one upload${res.locals.uploadCountText ? ` (at most ${res.locals.uploadCountText})` : ''}; nothing was saved`
            : `Upload refused: ${err.message}`;
      const code: ApiErrorCode = err.code === 'LIMIT_FILE_SIZE' ? 'FILE_TOO_LARGE' : err.code === 'LIMIT_FILE_COUNT' ? 'TOO_MANY_FILES' : tooBig ? 'BODY_TOO_LARGE' : 'UPLOAD_REFUSED';
      appError = new AppError(code, message, tooBig ? 413 : 400, { reason: err.code });
    } else if ((err as { type?: string }).type === 'entity.too.large') {
      appError = new AppError('BODY_TOO_LARGE', 'Request body is too large', 413);
    } else if ((err as { type?: string }).type === 'entity.parse.failed') {
      appError = new AppError('BAD_JSON', 'Request body is not valid JSON', 400);
    } else if (isDatabaseUnavailable(err)) {
      logger.warn({ err, reqId: res.locals.requestId, method: req.method, url: safeUrl(req.originalUrl) }, 'database unavailable');
      appError = new AppError('DATABASE_UNAVAILABLE', 'The database cannot be reached right now; try again in a moment', 503);
    } else {
      logger.error({ err, reqId: res.locals.requestId, method: req.method, url: safeUrl(req.originalUrl) }, 'request failed');
      appError = new AppError('INTERNAL', `Something went wrong on our side (reference ${res.locals.requestId ?? 'unknown'})`, 500);
    }
    if (appError.status === 429 && (appError.details as { retryAfterSeconds?: number })?.retryAfterSeconds) {
      res.set('Retry-After', String((appError.details as { retryAfterSeconds: number }).retryAfterSeconds));
    }
    if (res.headersSent) return res.end();
    const body: ApiErrorBody = { error: { code: appError.code, message: appError.message, details: appError.details } };
    res.status(appError.status).json(body);
  };
}
