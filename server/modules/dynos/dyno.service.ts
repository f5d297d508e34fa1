import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { notFound } from '../../lib/errors';
import type { DynoDto } from '@shared/schemas/run';
import type { z } from 'zod';
import type { dynoInput } from '@shared/schemas/run';
import { Dyno } from './dyno.entity';
import { Shop } from '../shops/shop.entity';
import { recordAudit } from '../audit/audit.service';

type DynoInput = z.output<typeof dynoInput>;

export const toDynoDto = (d: Dyno): DynoDto => ({ id: d.id, name: d.name, kind: d.kind, notes: d.notes });

export async function listDynos(em: EntityManager, actor: Actor): Promise<DynoDto[]> {
  const rows = await em.find(Dyno, { shop: actor.shopId }, { orderBy: { name: 'asc', id: 'asc' } });
  return rows.map(toDynoDto);
}

/** A dyno of the actor's shop, or 404. */
export async function getDynoEntity(em: EntityManager, actor: Actor, id: string): Promise<Dyno> {
  const dyno = await em.findOne(Dyno, { id, shop: actor.shopId });
  if (!dyno) throw notFound('Dyno');
  return dyno;
}

export async function createDyno(em: EntityManager, actor: Actor, input: DynoInput): Promise<DynoDto> {
  const dyno = em.create(Dyno, { ...input, shop: em.getReference(Shop, actor.shopId) } as Dyno);
  await em.flush();
  await recordAudit(em, actor, 'dyno.create', 'dyno', dyno.id, { name: dyno.name, kind: dyno.kind });
  return toDynoDto(dyno);
}

export async function updateDyno(em: EntityManager, actor: Actor, id: string, input: DynoInput): Promise<DynoDto> {
  const dyno = await getDynoEntity(em, actor, id);
  em.assign(dyno, input);
  await em.flush();
  await recordAudit(em, actor, 'dyno.update', 'dyno', dyno.id, { ...input });
  return toDynoDto(dyno);
}

/** Removes a dyno; its sessions keep their runs and lose the dyno link (foreign key sets null). */
export async function deleteDyno(em: EntityManager, actor: Actor, id: string): Promise<void> {
  const dyno = await getDynoEntity(em, actor, id);
  await em.removeAndFlush(dyno);
  await recordAudit(em, actor, 'dyno.delete', 'dyno', id, { name: dyno.name });
}
