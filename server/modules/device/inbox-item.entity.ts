import { EntitySchema } from '@mikro-orm/core';
import { ShopOwnedEntity, ShopOwnedSchema } from '../../db/base-entity';
import { Dyno } from '../dynos/dyno.entity';
import { User } from '../users/user.entity';

/** What a first reading of an inbox file found, before any bike is known. */
export interface InboxSummary {
  pulls: number;
  readable: number;
  peaks: { hp: number | null; rpm: number | null; lbft: number | null }[];
  error: string | null;
}

/**
 * A run file that arrived from a dyno with nothing on it: stored byte for byte (object storage)
 * and waiting for staff to assign it to a bike, session and stage. Nothing is guessed. Assigning
 * runs the normal upload pipeline; the item is then kept as a record (assignedAt, runIds).
 */
export class InboxItem extends ShopOwnedEntity {
  dyno: Dyno | null = null;
  originalName!: string;
  contentType: string | null = null;
  rawKey!: string;
  rawSha256!: string;
  sizeBytes!: number;
  summary!: InboxSummary;
  repeats = 0;
  assignedAt: Date | null = null;
  assignedBy: User | null = null;
  runIds: string[] | null = null;
}

export const InboxItemSchema = new EntitySchema<InboxItem, ShopOwnedEntity>({
  class: InboxItem,
  extends: ShopOwnedSchema,
  tableName: 'inbox_item',
  indexes: [{ properties: ['shop', 'assignedAt', 'createdAt'] }],
  properties: {
    dyno: { kind: 'm:1', entity: () => Dyno, nullable: true, deleteRule: 'set null' },
    originalName: { type: 'string', length: 500 },
    contentType: { type: 'string', length: 200, nullable: true },
    rawKey: { type: 'string', length: 500 },
    rawSha256: { type: 'string', length: 64 },
    sizeBytes: { type: 'integer' },
    summary: { type: 'json' },
    repeats: { type: 'integer', default: 0 },
    assignedAt: { type: 'datetime', columnType: 'timestamptz', nullable: true },
    assignedBy: { kind: 'm:1', entity: () => User, nullable: true, deleteRule: 'set null' },
    runIds: { type: 'json', nullable: true },
  },
});
