import { EntitySchema } from '@mikro-orm/core';
import { ShopOwnedEntity, ShopOwnedSchema } from '../../db/base-entity';
import { Bike } from '../bikes/bike.entity';
import { DynoSession } from '../sessions/dyno-session.entity';
import { Stage } from '../stages/stage.entity';

export type DynoKind = 'inertia' | 'eddy-current' | 'other';

/**
 * A dynamometer the shop owns. Runs from different dynos are not compared without a warning.
 * "On the dyno now" (`current*`): the bike strapped to it, its session and stage; files from the
 * dyno PC's sync agent land there (or in the shop's inbox when nothing is set).
 */
export class Dyno extends ShopOwnedEntity {
  name!: string;
  kind: DynoKind = 'inertia';
  notes: string | null = null;
  currentBike: Bike | null = null;
  currentSession: DynoSession | null = null;
  currentStage: Stage | null = null;
  currentSetAt: Date | null = null;
  /** Last request of this dyno's sync agent (any device token of the dyno). */
  agentLastHeardAt: Date | null = null;
}

export const DynoSchema = new EntitySchema<Dyno, ShopOwnedEntity>({
  class: Dyno,
  extends: ShopOwnedSchema,
  tableName: 'dyno',
  properties: {
    name: { type: 'string', length: 100 },
    kind: { type: 'string', length: 16 },
    notes: { type: 'text', nullable: true },
    currentBike: { kind: 'm:1', entity: () => Bike, nullable: true, deleteRule: 'set null' },
    currentSession: { kind: 'm:1', entity: () => DynoSession, nullable: true, deleteRule: 'set null' },
    currentStage: { kind: 'm:1', entity: () => Stage, nullable: true, deleteRule: 'set null' },
    currentSetAt: { type: 'datetime', columnType: 'timestamptz', nullable: true },
    agentLastHeardAt: { type: 'datetime', columnType: 'timestamptz', nullable: true },
  },
});
