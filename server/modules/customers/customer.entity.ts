import { EntitySchema } from '@mikro-orm/core';
import { ShopOwnedEntity, ShopOwnedSchema } from '../../db/base-entity';

/** A rider whose bikes the shop works on. */
export class Customer extends ShopOwnedEntity {
  name!: string;
  email: string | null = null;
  phone: string | null = null;
  notes: string | null = null;
  updatedAt: Date = new Date();
}

export const CustomerSchema = new EntitySchema<Customer, ShopOwnedEntity>({
  class: Customer,
  extends: ShopOwnedSchema,
  tableName: 'customer',
  indexes: [{ properties: ['shop', 'name'] }],
  properties: {
    name: { type: 'string', length: 200 },
    email: { type: 'string', length: 320, nullable: true },
    phone: { type: 'string', length: 60, nullable: true },
    notes: { type: 'text', nullable: true },
    updatedAt: { type: 'datetime', columnType: 'timestamptz', onUpdate: () => new Date() },
  },
});
