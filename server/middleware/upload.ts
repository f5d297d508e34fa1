import fs from 'node:fs';
import type express from 'express';
import multer from 'multer';
import type { AppConfig } from '../config/env';
import { logger } from '../lib/logger';
import { fitContentType, fitFileName } from '../lib/upload-names';

const mb = (bytes: number) => (bytes >= 1024 * 1024 ? `${(bytes / (1024 * 1024)).toFixed(bytes % (1024 * 1024) ? 1 : 0)} MB` : bytes >= 1024 ? `${Math.round(bytes / 1024)} KB` : `${bytes} bytes`);

/**
 * Multipart run-file upload: field `files` (one or more) plus text fields. Files are written to
 * UPLOAD_TMP_DIR (created on demand; multer names them with random hex), so a request holds no
 * file in memory; the pipeline hashes, stores and analyses them one at a time from disk.
 * Limits end as 413 with a plain message (the error middleware reads res.locals.uploadLimitText /
 * uploadCountText).
 *
 * Temporary files are removed: by multer itself when parsing fails (limits, aborted request);
 * by the route handler before it answers (removeUploadedFiles in a finally); and, as a safety net
 * for everything that ends the request in between (validation errors, a client gone mid-handler),
 * when the response closes.
 */
export function runFilesUpload(config: Pick<AppConfig, 'UPLOAD_MAX_FILE_BYTES' | 'UPLOAD_MAX_FILES' | 'UPLOAD_TMP_DIR'>): express.RequestHandler {
  const dir = config.UPLOAD_TMP_DIR;
  const upload = multer({
    storage: multer.diskStorage({
      destination: (_req, _file, cb) => {
        fs.promises.mkdir(dir, { recursive: true }).then(
          () => cb(null, dir),
          (err: Error) => cb(err, dir),
        );
      },
    }),
    // Browsers send file names as raw UTF-8.
    defParamCharset: 'utf8',
    limits: { fileSize: config.UPLOAD_MAX_FILE_BYTES, files: config.UPLOAD_MAX_FILES, fields: 20, fieldSize: 64 * 1024 },
    // The count limit is busboy's (LIMIT_FILE_COUNT → 413), not array()'s maxCount (which would say "unexpected field").
  }).array('files');
  const limitText = `${mb(config.UPLOAD_MAX_FILE_BYTES)} per file`;
  const countText = `${config.UPLOAD_MAX_FILES} files per upload`;
  return (req, res, next) => {
    res.locals.uploadLimitText = limitText;
    res.locals.uploadCountText = countText;
    res.once('close', () => {
      void removeUploadedFiles(req);
    });
    upload(req, res, (err?: unknown) => {
      // Names and types longer than the archive keeps are shortened and kept (lib/upload-names.ts).
      if (!err) {
        for (const f of uploadedFiles(req)) {
          if (typeof f.originalname === 'string') f.originalname = fitFileName(f.originalname);
          if (typeof f.mimetype === 'string') f.mimetype = fitContentType(f.mimetype) ?? '';
        }
      }
      next(err);
    });
  };
}

/** The uploaded files of a request (after runFilesUpload), in the order they were sent. */
export function uploadedFiles(req: express.Request): Express.Multer.File[] {
  const files = req.files;
  return Array.isArray(files) ? files : [];
}

/** Delete a request's temporary upload files; safe to call more than once, never throws. */
export async function removeUploadedFiles(req: express.Request): Promise<void> {
  await Promise.all(
    uploadedFiles(req)
      .map((f) => f.path)
      .filter((p): p is string => typeof p === 'string' && p.length > 0)
      .map((p) =>
        fs.promises.rm(p, { force: true }).catch((err: unknown) => {
          logger.warn({ err, path: p }, 'could not remove a temporary upload');
        }),
      ),
  );
}
