import { EntitySchema } from '@mikro-orm/core';
import { ShopOwnedEntity, ShopOwnedSchema } from '../../db/base-entity';
import { Bike } from '../bikes/bike.entity';
import { Run } from '../runs/run.entity';
import { User } from '../users/user.entity';

/** A saved set of runs, one of them the baseline, with the options used. Reports are made from these. */
export class Comparison extends ShopOwnedEntity {
  name!: string;
  /** The bike the comparison is about (the baseline run's bike). */
  bike!: Bike;
  baselineRun!: Run;
  runIds!: string[];
  options!: Record<string, unknown>;
  note: string | null = null;
  /**
   * Each run's colour slot when the comparison was saved (run-colors.ts), so its chart keeps its
   * colours when runs are later added to the bike's archive. Null for comparisons saved before.
   */
  colorSlots: Record<string, number> | null = null;
  createdBy: User | null = null;
}

export const ComparisonSchema = new EntitySchema<Comparison, ShopOwnedEntity>({
  class: Comparison,
  extends: ShopOwnedSchema,
  tableName: 'comparison',
  indexes: [{ properties: ['shop', 'bike'] }],
  properties: {
    name: { type: 'string', length: 200 },
    bike: { kind: 'm:1', entity: () => Bike, deleteRule: 'cascade' },
    baselineRun: { kind: 'm:1', entity: () => Run, deleteRule: 'cascade' },
    runIds: { type: 'json' },
    options: { type: 'json' },
    note: { type: 'text', nullable: true },
    colorSlots: { type: 'json', nullable: true },
    createdBy: { kind: 'm:1', entity: () => User, nullable: true, deleteRule: 'set null' },
  },
});
