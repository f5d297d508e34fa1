import type express from 'express';
import multer from 'multer';
import type { AppConfig } from '../config/env';

const mb = (bytes: number) => (bytes >= 1024 * 1024 ? `${(bytes / (1024 * 1024)).toFixed(bytes % (1024 * 1024) ? 1 : 0)} MB` : bytes >= 1024 ? `${Math.round(bytes / 1024)} KB` : `${bytes} bytes`);

/**
 * Multipart run-file upload: field `files` (one or more) plus text fields. Files are held in
 * memory (bounded by UPLOAD_MAX_FILE_BYTES × UPLOAD_MAX_FILES); the object store streams large
 * ones on through lib-storage's multipart upload. Limits end as 413 with a plain message (the
 * error middleware reads res.locals.uploadLimitText / uploadCountText).
 */
export function runFilesUpload(config: Pick<AppConfig, 'UPLOAD_MAX_FILE_BYTES' | 'UPLOAD_MAX_FILES'>): express.RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
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
    upload(req, res, next);
  };
}

/** The uploaded files of a request (after runFilesUpload), in the order they were sent. */
export function uploadedFiles(req: express.Request): Express.Multer.File[] {
  const files = req.files;
  return Array.isArray(files) ? files : [];
}
