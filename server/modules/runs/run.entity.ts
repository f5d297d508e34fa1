import { EntitySchema } from '@mikro-orm/core';
import { ShopOwnedEntity, ShopOwnedSchema } from '../../db/base-entity';
import { Bike } from '../bikes/bike.entity';
import { DynoSession } from '../sessions/dyno-session.entity';
import { Stage } from '../stages/stage.entity';
import { User } from '../users/user.entity';

export type RunStatus = 'ready' | 'needs-mapping' | 'failed';

/** Resampled sweep as stored: uncorrected, so any correction standard can be applied later. */
export interface StoredCurve {
  rpm: number[];
  torqueLbft: number[];
  powerHp: number[];
  afr: Record<string, number[]>;
}

/** Engine speed per road/roller speed for the gear used, for logs without an engine-speed column. */
export interface StoredRpmPerSpeed {
  ratio: number;
  unit: 'mph' | 'km/h';
}

/**
 * One pull: the raw file as uploaded (kept in object storage, byte for byte) and what the
 * analysis engine made of it. Summary columns are copied out of the curve for sorting and search.
 * A log holding several pulls is stored once; each pull is a run pointing at it (`pullIndex`).
 */
export class Run extends ShopOwnedEntity {
  bike!: Bike;
  session: DynoSession | null = null;
  stage: Stage | null = null;
  label: string | null = null;
  sequence = 1;
  rawKey!: string;
  rawSha256!: string;
  rawSizeBytes!: number;
  originalName!: string;
  contentType: string | null = null;
  /** Which pull of the raw file this run is (0-based, time order) and how many the file held when last read. */
  pullIndex = 0;
  pullCount = 1;
  /** Time-column values at the pull's first and last sample (null without a time column or a reading). */
  pullStartS: number | null = null;
  pullEndS: number | null = null;
  /** 0-based data-row indices of the pull's first and last sample. */
  pullFirstRow: number | null = null;
  pullLastRow: number | null = null;
  /** Engine-speed ratio given for a log without an engine-speed column. */
  rpmPerSpeed: StoredRpmPerSpeed | null = null;
  status: RunStatus = 'failed';
  mapping: Record<string, unknown> | null = null;
  headerSignature: string | null = null;
  curve: StoredCurve | null = null;
  peakPowerHp: number | null = null;
  peakPowerRpm: number | null = null;
  peakTorqueLbft: number | null = null;
  peakTorqueRpm: number | null = null;
  rpmMin: number | null = null;
  rpmMax: number | null = null;
  points: number | null = null;
  identityStatus: string | null = null;
  maxDeviationPct: number | null = null;
  correctionStandard: string | null = null;
  correctionFactor: number | null = null;
  conditions: Record<string, unknown> | null = null;
  columns: Record<string, unknown> | null = null;
  warnings: { code: string; message: string }[] = [];
  error: { code: string; message: string; details?: unknown } | null = null;
  tags: string[] = [];
  note: string | null = null;
  uploadedBy: User | null = null;
  updatedAt: Date = new Date();
  deletedAt: Date | null = null;
}

/** A column mapping the shop saved for a file layout, reused when the same header appears again. */
export class ColumnLayout extends ShopOwnedEntity {
  name!: string;
  headerSignature!: string;
  mapping!: Record<string, unknown>;
}

export const RunSchema = new EntitySchema<Run, ShopOwnedEntity>({
  class: Run,
  extends: ShopOwnedSchema,
  tableName: 'run',
  indexes: [
    { properties: ['shop', 'bike', 'createdAt'] },
    { properties: ['shop', 'session'] },
    { properties: ['shop', 'stage'] },
    { properties: ['shop', 'peakPowerHp'] },
  ],
  uniques: [{ properties: ['bike', 'rawSha256', 'pullIndex'] }],
  properties: {
    bike: { kind: 'm:1', entity: () => Bike, deleteRule: 'cascade' },
    session: { kind: 'm:1', entity: () => DynoSession, nullable: true, deleteRule: 'set null' },
    stage: { kind: 'm:1', entity: () => Stage, nullable: true, deleteRule: 'set null' },
    label: { type: 'string', length: 200, nullable: true },
    sequence: { type: 'integer' },
    rawKey: { type: 'string', length: 500, fieldName: 'raw_key' },
    rawSha256: { type: 'string', length: 64, fieldName: 'raw_sha256' },
    rawSizeBytes: { type: 'integer', fieldName: 'raw_size_bytes' },
    originalName: { type: 'string', length: 300 },
    contentType: { type: 'string', length: 120, nullable: true },
    pullIndex: { type: 'integer', default: 0 },
    pullCount: { type: 'integer', default: 1 },
    pullStartS: { type: 'double', nullable: true },
    pullEndS: { type: 'double', nullable: true },
    pullFirstRow: { type: 'integer', nullable: true },
    pullLastRow: { type: 'integer', nullable: true },
    rpmPerSpeed: { type: 'json', nullable: true },
    status: { type: 'string', length: 16 },
    mapping: { type: 'json', nullable: true },
    headerSignature: { type: 'string', length: 500, nullable: true },
    curve: { type: 'json', nullable: true, lazy: true },
    peakPowerHp: { type: 'double', nullable: true },
    peakPowerRpm: { type: 'double', nullable: true },
    peakTorqueLbft: { type: 'double', nullable: true },
    peakTorqueRpm: { type: 'double', nullable: true },
    rpmMin: { type: 'double', nullable: true },
    rpmMax: { type: 'double', nullable: true },
    points: { type: 'integer', nullable: true },
    identityStatus: { type: 'string', length: 16, nullable: true },
    maxDeviationPct: { type: 'double', nullable: true },
    correctionStandard: { type: 'string', length: 32, nullable: true },
    correctionFactor: { type: 'double', nullable: true },
    conditions: { type: 'json', nullable: true },
    columns: { type: 'json', nullable: true },
    warnings: { type: 'json' },
    error: { type: 'json', nullable: true },
    tags: { type: 'text[]' , default: '{}' },
    note: { type: 'text', nullable: true },
    uploadedBy: { kind: 'm:1', entity: () => User, nullable: true, deleteRule: 'set null' },
    updatedAt: { type: 'datetime', columnType: 'timestamptz', onUpdate: () => new Date() },
    deletedAt: { type: 'datetime', columnType: 'timestamptz', nullable: true },
  },
});

export const ColumnLayoutSchema = new EntitySchema<ColumnLayout, ShopOwnedEntity>({
  class: ColumnLayout,
  extends: ShopOwnedSchema,
  tableName: 'column_layout',
  uniques: [{ properties: ['shop', 'headerSignature'] }],
  properties: {
    name: { type: 'string', length: 120 },
    headerSignature: { type: 'string', length: 500 },
    mapping: { type: 'json' },
  },
});
