import { EntitySchema } from '@mikro-orm/core';
import { randomUUID } from 'node:crypto';
import { Shop } from '../shops/shop.entity';

export type DynoKind = 'inertia' | 'eddy-current' | 'other';

/** A dynamometer the shop owns. Runs from different dynos are not compared without a warning. */
export class Dyno {
  id: string = randomUUID();
  shop!: Shop;
  name!: string;
  kind: DynoKind = 'inertia';
  notes: string | null = null;
  createdAt: Date = new Date();
}

export const DynoSchema = new EntitySchema<Dyno>({
  class: Dyno,
  tableName: 'dyno',
  properties: {
    id: { type: 'uuid', primary: true },
    shop: { kind: 'm:1', entity: () => Shop, deleteRule: 'cascade' },
    name: { type: 'string', length: 100 },
    kind: { type: 'string', length: 16 },
    notes: { type: 'text', nullable: true },
    createdAt: { type: 'datetime', columnType: 'timestamptz' },
  },
});
