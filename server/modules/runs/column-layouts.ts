/** The shop's saved column layouts (named mappings reused when the same header appears again). */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { notFound } from '../../lib/errors';
import type { ColumnLayoutDto } from '@shared/schemas/run';
import { ColumnLayout } from './run.entity';
import { recordAudit } from '../audit/audit.service';

const toLayoutDto = (l: ColumnLayout): ColumnLayoutDto => ({ id: l.id, name: l.name, headerSignature: l.headerSignature, mapping: l.mapping, createdAt: l.createdAt.toISOString() });

export async function listLayouts(em: EntityManager, actor: Actor): Promise<ColumnLayoutDto[]> {
  return (await em.find(ColumnLayout, { shop: actor.shopId }, { orderBy: { name: 'asc', id: 'asc' } })).map(toLayoutDto);
}

/** Forgets a layout and audits it in one transaction. */
export async function deleteLayout(em: EntityManager, actor: Actor, id: string): Promise<void> {
  const layout = await em.findOne(ColumnLayout, { id, shop: actor.shopId });
  if (!layout) throw notFound('Column layout');
  await em.transactional(async (tem) => {
    tem.remove(layout);
    await tem.flush();
    await recordAudit(tem, actor, 'column-layout.delete', 'column-layout', id, { name: layout.name });
  });
}
