import { EntitySchema } from '@mikro-orm/core';
import { randomUUID } from 'node:crypto';
import { Shop } from '../shops/shop.entity';

/** A rider whose bikes the shop works on. */
export class Customer {
  id: string = randomUUID();
  shop!: Shop;
  name!: string;
  email: string | null = null;
  phone: string | null = null;
  notes: string | null = null;
  createdAt: Date = new Date();
  updatedAt: Date = new Date();
}

export const CustomerSchema = new EntitySchema<Customer>({
  class: Customer,
  tableName: 'customer',
  indexes: [{ properties: ['shop', 'name'] }],
  properties: {
    id: { type: 'uuid', primary: true },
    shop: { kind: 'm:1', entity: () => Shop, deleteRule: 'cascade' },
    name: { type: 'string', length: 200 },
    email: { type: 'string', length: 320, nullable: true },
    phone: { type: 'string', length: 60, nullable: true },
    notes: { type: 'text', nullable: true },
    createdAt: { type: 'datetime', columnType: 'timestamptz' },
    updatedAt: { type: 'datetime', columnType: 'timestamptz', onUpdate: () => new Date() },
  },
});
