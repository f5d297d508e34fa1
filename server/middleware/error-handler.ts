import type express from 'express';
import { NotFoundError } from '@mikro-orm/core';
import multer from 'multer';
import type { ApiErrorBody, ApiErrorCode } from '@shared/errors';
import { AppError } from '../lib/errors';
import { logger, safeUrl } from '../lib/logger';
import { isDatabaseUnavailable } from '../lib/db-errors';

/** busboy's words for a multipart body that does not parse (multer passes them on as plain errors). */
const MULTIPART_PROBLEM = /^(Request aborted|Unexpected end of (form|file)|Malformed part header|Multipart: Boundary not found|Malformed urlencoded form|Part terminated early|Unexpected end of multipart data)/i;

/** A request the client got wrong at the HTTP level: 400/415 with a stable code, never 500. */
export function malformedRequest(err: unknown): AppError | null {
  const e = (err ?? {}) as { type?: string; status?: number; expose?: boolean; message?: string; code?: string; name?: string };
  if (e.type === 'encoding.unsupported' || e.type === 'charset.unsupported') {
    return new AppError('UNSUPPORTED_ENCODING', `The request body's ${e.type === 'charset.unsupported' ? 'character set' : 'Content-Encoding'} is not supported; send it uncompressed (or gzip, deflate, br for JSON) in UTF-8`, 415);
  }
  if (err instanceof URIError || (e.status === 400 && /decode/i.test(e.message ?? ''))) {
    return new AppError('BAD_ENCODING', 'The address has a malformed percent-encoding (e.g. a lone "%")', 400);
  }
  if (typeof e.message === 'string' && MULTIPART_PROBLEM.test(e.message)) {
    return new AppError('MALFORMED_MULTIPART', 'The upload is not a complete multipart form; nothing was saved. Try the upload again', 400);
  }
  // PostgreSQL class 22 (data exception): a date, number or text the database cannot take (a year
  // 0 or 10000, 30 February, an integer out of range) that got past validation.
  if (typeof e.code === 'string' && /^22[0-9A-Z]{3}$/.test(e.code) && ('severity' in (err as object) || e.name === 'DriverException' || /Exception$/.test(e.name ?? ''))) {
    return new AppError('INVALID_VALUE', 'A value in the request is out of range or not a valid date or number', 400);
  }
  if (typeof e.status === 'number' && e.status >= 400 && e.status < 500 && e.expose) {
    return new AppError(e.status === 415 ? 'UNSUPPORTED_ENCODING' : 'BAD_REQUEST', e.message ?? 'Bad request', e.status);
  }
  return null;
}

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
    } else if (malformedRequest(err)) {
      appError = malformedRequest(err)!;
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
