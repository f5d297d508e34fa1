import { EntitySchema } from '@mikro-orm/core';
import { ShopOwnedEntity, ShopOwnedSchema } from '../../db/base-entity';
import { User } from '../users/user.entity';

/** Who did what, when: every upload, edit and delete in the archive. Append-only. */
export class AuditEntry extends ShopOwnedEntity {
  user: User | null = null;
  action!: string;
  entityType!: string;
  entityId!: string;
  details: Record<string, unknown> | null = null;
}

export const AuditEntrySchema = new EntitySchema<AuditEntry, ShopOwnedEntity>({
  class: AuditEntry,
  extends: ShopOwnedSchema,
  tableName: 'audit_entry',
  indexes: [{ properties: ['shop', 'createdAt'] }],
  properties: {
    user: { kind: 'm:1', entity: () => User, nullable: true, deleteRule: 'set null' },
    action: { type: 'string', length: 60 },
    entityType: { type: 'string', length: 40 },
    entityId: { type: 'string', length: 64 },
    details: { type: 'json', nullable: true },
  },
});
