/** The original bytes of a run, as a stream from object storage (the route pipes it out). */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { AppDeps } from '../../app-deps';
import type { Actor } from '../../http/actor';
import { getRunEntity } from './run-scope';

export async function rawFile(em: EntityManager, deps: AppDeps, actor: Actor, id: string) {
  const run = await getRunEntity(em, actor, id);
  const obj = await deps.storage.getStream(run.rawKey);
  return { run, obj };
}

/** Content-Disposition with a plain fallback and the UTF-8 name (RFC 6266 / RFC 8187). */
export function contentDisposition(name: string) {
  const fallback = name.replace(/[^\x20-\x7e]|["\\]/g, '_');
  return `attachment; filename="${fallback}"; filename*=UTF-8''${encodeURIComponent(name)}`;
}
