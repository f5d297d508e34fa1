/** One run with its curve, as the actor may see it. */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import type { RunDetailDto } from '@shared/schemas/run';
import { toRunDetail } from './run-dto';
import { getRunEntity } from './run-scope';

export async function runDetail(em: EntityManager, actor: Actor, id: string): Promise<RunDetailDto> {
  const run = await getRunEntity(em, actor, id, { curve: true });
  return toRunDetail(em, run);
}
