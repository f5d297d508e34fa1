import { EntitySchema } from '@mikro-orm/core';
import { ShopOwnedEntity, ShopOwnedSchema } from '../../db/base-entity';
import type { HeadWorkLevel, PartCategory } from '@shared/parts';
import { Bike } from '../bikes/bike.entity';
import { Run } from '../runs/run.entity';

/**
 * A named state of a bike's build ("Baseline", "Stage 1", …), ordered by position. The gain
 * columns are derived from the reference runs (this stage against the bike's baseline stage) and
 * kept up to date by the stage service so the build finder can search them without recomputing.
 */
export class Stage extends ShopOwnedEntity {
  bike!: Bike;
  position = 0;
  name!: string;
  date: string | null = null;
  description: string | null = null;
  referenceRun: Run | null = null;
  gainPeakPowerHp: number | null = null;
  gainPeakTorqueLbft: number | null = null;
  gainAreaPct: number | null = null;
  gainAveragePowerHp: number | null = null;
  totalCostCents = 0;
}

/** A part or job fitted at a stage, with what it cost. */
export class Part extends ShopOwnedEntity {
  stage!: Stage;
  category!: PartCategory;
  description!: string;
  partCostCents = 0;
  labourCostCents = 0;
  /** Only for category `cylinder-heads`. */
  headWorkLevel: HeadWorkLevel | null = null;
}

export const StageSchema = new EntitySchema<Stage, ShopOwnedEntity>({
  class: Stage,
  extends: ShopOwnedSchema,
  tableName: 'stage',
  indexes: [{ properties: ['shop', 'bike', 'position'] }],
  properties: {
    bike: { kind: 'm:1', entity: () => Bike, deleteRule: 'cascade' },
    position: { type: 'integer' },
    name: { type: 'string', length: 120 },
    date: { type: 'date', nullable: true },
    description: { type: 'text', nullable: true },
    referenceRun: { kind: 'm:1', entity: () => Run, nullable: true, deleteRule: 'set null' },
    gainPeakPowerHp: { type: 'double', nullable: true },
    gainPeakTorqueLbft: { type: 'double', nullable: true },
    gainAreaPct: { type: 'double', nullable: true },
    gainAveragePowerHp: { type: 'double', nullable: true },
    totalCostCents: { type: 'integer', default: 0 },
  },
});

export const PartSchema = new EntitySchema<Part, ShopOwnedEntity>({
  class: Part,
  extends: ShopOwnedSchema,
  tableName: 'part',
  indexes: [{ properties: ['shop', 'category', 'headWorkLevel'] }],
  properties: {
    stage: { kind: 'm:1', entity: () => Stage, deleteRule: 'cascade' },
    category: { type: 'string', length: 32 },
    description: { type: 'text' },
    partCostCents: { type: 'integer', default: 0 },
    labourCostCents: { type: 'integer', default: 0 },
    headWorkLevel: { type: 'string', length: 32, nullable: true },
  },
});
