import { EntitySchema } from '@mikro-orm/core';
import { randomUUID } from 'node:crypto';

import type { UnitSystem } from '@shared/units-display';
import type { DepositMode } from '@shared/schemas/plans';

export type { UnitSystem };
export type PaperSize = 'letter' | 'a4';

/** A performance shop: the tenant. Every other row belongs to exactly one shop. */
export class Shop {
  id: string = randomUUID();
  name!: string;
  address: string | null = null;
  phone: string | null = null;
  email: string | null = null;
  /** Object-storage key of the logo shown on reports. */
  logoKey: string | null = null;
  /** Units printed on reports: hp/lb·ft or kW/N·m. */
  units: UnitSystem = 'imperial';
  paperSize: PaperSize = 'letter';
  /** Correction standard proposed for new sessions and comparisons. */
  defaultCorrection = 'sae-j1349';
  /** IANA zone of the shop's calendar day: today's session, dates on reports and quotes. */
  timeZone = 'UTC';
  /** Labour rate used when a part row has no labour cost of its own (cents per hour). */
  createdAt: Date = new Date();
  /** ISO 4217 code, lower case (as the payment provider takes it); every amount is in its minor unit (cents). */
  currency = 'usd';
  /** Deposit asked when a build plan is accepted: none, a percentage of the plan, or a fixed amount. */
  depositMode: DepositMode = 'off';
  depositPercent = 0;
  depositFixedCents = 0;
}

export const ShopSchema = new EntitySchema<Shop>({
  class: Shop,
  tableName: 'shop',
  properties: {
    id: { type: 'uuid', primary: true },
    name: { type: 'string', length: 200 },
    address: { type: 'text', nullable: true },
    phone: { type: 'string', length: 60, nullable: true },
    email: { type: 'string', length: 320, nullable: true },
    logoKey: { type: 'string', length: 500, nullable: true, fieldName: 'logo_key' },
    units: { type: 'string', length: 16, default: 'imperial' },
    paperSize: { type: 'string', length: 16, default: 'letter' },
    defaultCorrection: { type: 'string', length: 32, default: 'sae-j1349' },
    timeZone: { type: 'string', length: 64, default: 'UTC', fieldName: 'time_zone' },
    createdAt: { type: 'datetime', columnType: 'timestamptz' },
    currency: { type: 'string', length: 3, default: 'usd' },
    depositMode: { type: 'string', length: 16, default: 'off' },
    depositPercent: { type: 'integer', default: 0 },
    depositFixedCents: { type: 'integer', default: 0 },
  },
});
