import { EntitySchema } from '@mikro-orm/core';
import { randomUUID } from 'node:crypto';

/**
 * An object written to storage whose database row never committed (and whose immediate removal
 * also failed). The reconciliation pass at start-up deletes these.
 */
export class OrphanObject {
  id: string = randomUUID();
  key!: string;
  reason!: string;
  createdAt: Date = new Date();
}

export const OrphanObjectSchema = new EntitySchema<OrphanObject>({
  class: OrphanObject,
  tableName: 'orphan_object',
  properties: {
    id: { type: 'uuid', primary: true },
    key: { type: 'string', length: 500 },
    reason: { type: 'text' },
    createdAt: { type: 'datetime', columnType: 'timestamptz' },
  },
});
