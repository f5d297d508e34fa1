import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { notFound } from '../../lib/errors';
import { tenantScope } from '../../http/tenant-scope';
import { wholePage, type Page } from '@shared/schemas/common';
import type { DynoDto } from '@shared/schemas/run';
import type { z } from 'zod';
import type { dynoInput } from '@shared/schemas/run';
import { Dyno } from './dyno.entity';
import { Shop } from '../shops/shop.entity';
import { recordAudit } from '../audit/audit.service';

type DynoInput = z.output<typeof dynoInput>;

export const toDynoDto = (d: Dyno): DynoDto => ({ id: d.id, name: d.name, kind: d.kind, notes: d.notes });

/** The shop's dynos by name: a short list by nature, answered whole. */
export async function listDynos(em: EntityManager, actor: Actor): Promise<Page<DynoDto>> {
  const rows = await em.find(Dyno, tenantScope<Dyno>(actor), { orderBy: { name: 'asc', id: 'asc' } });
  return wholePage(rows.map(toDynoDto));
}

/** A dyno of the actor's shop, or 404. */
export async function getDynoEntity(em: EntityManager, actor: Actor, id: string): Promise<Dyno> {
  const dyno = await em.findOne(Dyno, tenantScope<Dyno>(actor, undefined, { id }));
  if (!dyno) throw notFound('Dyno');
  return dyno;
}

export async function createDyno(em: EntityManager, actor: Actor, input: DynoInput): Promise<DynoDto> {
  const dyno = await em.transactional(async (tx) => {
    const created = tx.create(Dyno, { ...input, shop: tx.getReference(Shop, actor.shopId) } as Dyno);
    await recordAudit(tx, actor, 'dyno.create', 'dyno', created.id, { name: created.name, kind: created.kind });
    return created;
  });
  return toDynoDto(dyno);
}

export async function updateDyno(em: EntityManager, actor: Actor, id: string, input: DynoInput): Promise<DynoDto> {
  const dyno = await em.transactional(async (tx) => {
    const found = await getDynoEntity(tx, actor, id);
    tx.assign(found, input);
    await recordAudit(tx, actor, 'dyno.update', 'dyno', found.id, { ...input });
    return found;
  });
  return toDynoDto(dyno);
}

/** Removes a dyno; its sessions keep their runs and lose the dyno link (foreign key sets null). */
export async function deleteDyno(em: EntityManager, actor: Actor, id: string): Promise<void> {
  await em.transactional(async (tx) => {
    const dyno = await getDynoEntity(tx, actor, id);
    tx.remove(dyno);
    await recordAudit(tx, actor, 'dyno.delete', 'dyno', id, { name: dyno.name });
  });
}
