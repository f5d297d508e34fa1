import { EntitySchema } from '@mikro-orm/core';
import { ShopOwnedEntity, ShopOwnedSchema } from '../../db/base-entity';
import { Customer } from '../customers/customer.entity';

/** A customer's motorcycle. Displacement is stored in cm³ whatever unit it was entered in. */
export class Bike extends ShopOwnedEntity {
  customer!: Customer;
  make!: string;
  model!: string;
  year: number | null = null;
  vin: string | null = null;
  engineFamily: string | null = null;
  displacementCc: number | null = null;
  cylinders: number | null = null;
  notes: string | null = null;
  updatedAt: Date = new Date();
}

export const BikeSchema = new EntitySchema<Bike, ShopOwnedEntity>({
  class: Bike,
  extends: ShopOwnedSchema,
  tableName: 'bike',
  indexes: [{ properties: ['shop', 'customer'] }, { properties: ['shop', 'make', 'model'] }],
  properties: {
    customer: { kind: 'm:1', entity: () => Customer, deleteRule: 'cascade' },
    make: { type: 'string', length: 100 },
    model: { type: 'string', length: 100 },
    year: { type: 'integer', nullable: true },
    vin: { type: 'string', length: 17, nullable: true },
    engineFamily: { type: 'string', length: 100, nullable: true },
    displacementCc: { type: 'double', nullable: true },
    cylinders: { type: 'integer', nullable: true },
    notes: { type: 'text', nullable: true },
    updatedAt: { type: 'datetime', columnType: 'timestamptz', onUpdate: () => new Date() },
  },
});
