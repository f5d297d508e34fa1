/**
 * The raw file of a run: its SHA-256 (the duplicate check and the integrity check on re-processing)
 * and its key in object storage, where it is written before anything else.
 */
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import type { AppDeps } from '../../app-deps';

/**
 * A file to ingest: either bytes in memory (demo archive, small callers) or a file on disk (the
 * upload route's temporary files, the import command's folder). Files on disk are never read
 * into memory whole: hashed and stored as streams, analysed with the streaming reader.
 */
export type IncomingFile = { originalName: string; contentType: string | null } & ({ bytes: Buffer; path?: undefined } | { path: string; bytes?: undefined });

export const sha256Hex = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

/** SHA-256 of a file on disk, streamed (constant memory). */
export async function sha256File(file: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of fs.createReadStream(file)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

/** SHA-256 of an incoming file, streamed when it is on disk. */
export const sha256Of = (f: IncomingFile) => (f.path !== undefined ? sha256File(f.path) : Promise.resolve(sha256Hex(f.bytes)));

/** Where a bike's raw file lives: one object per distinct content, named by its hash. */
export const rawKeyFor = (shopId: string, bikeId: string, sha256: string) => `shops/${shopId}/bikes/${bikeId}/${sha256}`;

/** Writes an incoming file to object storage under `key`; answers its size in bytes. */
export async function putRawFile(deps: AppDeps, key: string, f: IncomingFile): Promise<number> {
  // A file on disk goes up as a stream (lib-storage's Upload, multipart above its part size).
  const size = f.path !== undefined ? (await fs.promises.stat(f.path)).size : f.bytes.length;
  const body = f.path !== undefined ? fs.createReadStream(f.path) : f.bytes;
  try {
    await deps.storage.put(key, body, { contentType: f.contentType ?? 'application/octet-stream' });
  } finally {
    if (body instanceof fs.ReadStream) body.destroy(); // a failed put may leave it open
  }
  return size;
}
