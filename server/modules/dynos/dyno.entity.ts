import { EntitySchema } from '@mikro-orm/core';
import { ShopOwnedEntity, ShopOwnedSchema } from '../../db/base-entity';

export type DynoKind = 'inertia' | 'eddy-current' | 'other';

/** A dynamometer the shop owns. Runs from different dynos are not compared without a warning. */
export class Dyno extends ShopOwnedEntity {
  name!: string;
  kind: DynoKind = 'inertia';
  notes: string | null = null;
}

export const DynoSchema = new EntitySchema<Dyno, ShopOwnedEntity>({
  class: Dyno,
  extends: ShopOwnedSchema,
  tableName: 'dyno',
  properties: {
    name: { type: 'string', length: 100 },
    kind: { type: 'string', length: 16 },
    notes: { type: 'text', nullable: true },
  },
});
