import fs from 'node:fs/promises';
import path from 'node:path';
import { logger } from './logger';

/**
 * Removes files in the upload temp folder not written to for `graceSeconds`: a request killed
 * with its process leaves its files there. A younger file may belong to an upload another
 * instance on this machine is receiving right now, so it stays. Answers how many were removed.
 */
export async function removeStaleTempUploads(dir: string, graceSeconds: number, now = Date.now()): Promise<number> {
  const names = await fs.readdir(dir).catch(() => [] as string[]);
  let removed = 0;
  for (const name of names) {
    const file = path.join(dir, name);
    try {
      const st = await fs.stat(file);
      if (!st.isFile() || now - st.mtimeMs < graceSeconds * 1000) continue;
      await fs.rm(file, { force: true });
      removed++;
    } catch (err) {
      logger.warn({ err, file }, 'could not remove a temporary upload file');
    }
  }
  return removed;
}
