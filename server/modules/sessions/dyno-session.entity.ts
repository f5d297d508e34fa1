import { EntitySchema } from '@mikro-orm/core';
import { ShopOwnedEntity, ShopOwnedSchema } from '../../db/base-entity';
import { Bike } from '../bikes/bike.entity';
import { Dyno } from '../dynos/dyno.entity';
import { User } from '../users/user.entity';

/** One visit of a bike on the dyno, with the ambient conditions of that day. */
export class DynoSession extends ShopOwnedEntity {
  bike!: Bike;
  startedAt: Date = new Date();
  dyno: Dyno | null = null;
  operator: User | null = null;
  ambientTempC: number | null = null;
  baroKpa: number | null = null;
  humidityPct: number | null = null;
  correctionStandard = 'sae-j1349';
  notes: string | null = null;
  safetyConfirmedBy: User | null = null;
  safetyConfirmedAt: Date | null = null;
  /** Started from the bay with the shop's default conditions: temperature, pressure and humidity still to be confirmed. */
  conditionsToConfirm = false;
}

export const DynoSessionSchema = new EntitySchema<DynoSession, ShopOwnedEntity>({
  class: DynoSession,
  extends: ShopOwnedSchema,
  tableName: 'dyno_session',
  indexes: [{ properties: ['shop', 'bike', 'startedAt'] }],
  properties: {
    bike: { kind: 'm:1', entity: () => Bike, deleteRule: 'cascade' },
    startedAt: { type: 'datetime', columnType: 'timestamptz' },
    dyno: { kind: 'm:1', entity: () => Dyno, nullable: true, deleteRule: 'set null' },
    operator: { kind: 'm:1', entity: () => User, nullable: true, deleteRule: 'set null' },
    ambientTempC: { type: 'double', nullable: true },
    baroKpa: { type: 'double', nullable: true },
    humidityPct: { type: 'double', nullable: true },
    correctionStandard: { type: 'string', length: 32 },
    notes: { type: 'text', nullable: true },
    safetyConfirmedBy: { kind: 'm:1', entity: () => User, nullable: true, deleteRule: 'set null' },
    safetyConfirmedAt: { type: 'datetime', columnType: 'timestamptz', nullable: true },
    conditionsToConfirm: { type: 'boolean', default: false },
  },
});
