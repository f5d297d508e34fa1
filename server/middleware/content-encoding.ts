import type { RequestHandler } from 'express';
import { AppError } from '../lib/errors';

/** Encodings the JSON body parser decodes (body-parser: gzip, deflate, br) besides none at all. */
const JSON_ENCODINGS = new Set(['identity', 'gzip', 'deflate', 'br']);

/**
 * Refuses a request body in a Content-Encoding the app does not decode with 415
 * UNSUPPORTED_ENCODING before anything reads it. Uploads (multipart) are never decoded, so only
 * identity passes there; JSON bodies may also come gzip, deflate or br.
 */
export const contentEncodingGuard: RequestHandler = (req, _res, next) => {
  const header = req.headers['content-encoding'];
  if (!header) return next();
  const encodings = header.toLowerCase().split(',').map((e) => e.trim()).filter(Boolean);
  const allowed = req.is('application/json') ? JSON_ENCODINGS : new Set(['identity']);
  const bad = encodings.find((e) => !allowed.has(e));
  if (!bad) return next();
  next(new AppError('UNSUPPORTED_ENCODING', `Content-Encoding "${bad.slice(0, 40)}" is not supported here; send the body uncompressed`, 415));
};
