import { EntitySchema } from '@mikro-orm/core';
import { randomUUID } from 'node:crypto';
import { Shop } from '../shops/shop.entity';
import { User } from '../users/user.entity';

/** Who did what, when: every upload, edit and delete in the archive. Append-only. */
export class AuditEntry {
  id: string = randomUUID();
  shop!: Shop;
  user: User | null = null;
  action!: string;
  entityType!: string;
  entityId!: string;
  details: Record<string, unknown> | null = null;
  createdAt: Date = new Date();
}

export const AuditEntrySchema = new EntitySchema<AuditEntry>({
  class: AuditEntry,
  tableName: 'audit_entry',
  indexes: [{ properties: ['shop', 'createdAt'] }],
  properties: {
    id: { type: 'uuid', primary: true },
    shop: { kind: 'm:1', entity: () => Shop, deleteRule: 'cascade' },
    user: { kind: 'm:1', entity: () => User, nullable: true, deleteRule: 'set null' },
    action: { type: 'string', length: 60 },
    entityType: { type: 'string', length: 40 },
    entityId: { type: 'string', length: 64 },
    details: { type: 'json', nullable: true },
    createdAt: { type: 'datetime', columnType: 'timestamptz' },
  },
});
