import { EntitySchema } from '@mikro-orm/core';
import { randomUUID } from 'node:crypto';
import { Shop } from '../modules/shops/shop.entity';

/**
 * What every row of a shop carries: a random uuid, the owning shop (rows go with their shop) and
 * when it was created. Entities extend this class, and their schema names `ShopOwnedSchema` in
 * `extends`, so the field list is written once. The columns are the same ones each table always had.
 */
export abstract class ShopOwnedEntity {
  id: string = randomUUID();
  shop!: Shop;
  createdAt: Date = new Date();
}

export const ShopOwnedSchema = new EntitySchema<ShopOwnedEntity>({
  name: 'ShopOwnedEntity',
  class: ShopOwnedEntity as unknown as new () => ShopOwnedEntity,
  abstract: true,
  properties: {
    id: { type: 'uuid', primary: true },
    shop: { kind: 'm:1', entity: () => Shop, deleteRule: 'cascade' },
    createdAt: { type: 'datetime', columnType: 'timestamptz' },
  },
});
