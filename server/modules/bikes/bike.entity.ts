import { EntitySchema } from '@mikro-orm/core';
import { randomUUID } from 'node:crypto';
import { Shop } from '../shops/shop.entity';
import { Customer } from '../customers/customer.entity';

/** A customer's motorcycle. Displacement is stored in cm³ whatever unit it was entered in. */
export class Bike {
  id: string = randomUUID();
  shop!: Shop;
  customer!: Customer;
  make!: string;
  model!: string;
  year: number | null = null;
  vin: string | null = null;
  engineFamily: string | null = null;
  displacementCc: number | null = null;
  cylinders: number | null = null;
  notes: string | null = null;
  createdAt: Date = new Date();
  updatedAt: Date = new Date();
}

export const BikeSchema = new EntitySchema<Bike>({
  class: Bike,
  tableName: 'bike',
  indexes: [{ properties: ['shop', 'customer'] }, { properties: ['shop', 'make', 'model'] }],
  properties: {
    id: { type: 'uuid', primary: true },
    shop: { kind: 'm:1', entity: () => Shop, deleteRule: 'cascade' },
    customer: { kind: 'm:1', entity: () => Customer, deleteRule: 'cascade' },
    make: { type: 'string', length: 100 },
    model: { type: 'string', length: 100 },
    year: { type: 'integer', nullable: true },
    vin: { type: 'string', length: 17, nullable: true },
    engineFamily: { type: 'string', length: 100, nullable: true },
    displacementCc: { type: 'double', nullable: true },
    cylinders: { type: 'integer', nullable: true },
    notes: { type: 'text', nullable: true },
    createdAt: { type: 'datetime', columnType: 'timestamptz' },
    updatedAt: { type: 'datetime', columnType: 'timestamptz', onUpdate: () => new Date() },
  },
});
