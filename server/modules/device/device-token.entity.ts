import { EntitySchema } from '@mikro-orm/core';
import { ShopOwnedEntity, ShopOwnedSchema } from '../../db/base-entity';
import { Dyno } from '../dynos/dyno.entity';
import { User } from '../users/user.entity';

/**
 * The key one dyno's sync agent uses: upload run files for that dyno, nothing else. Only the
 * SHA-256 of the token is stored; the token itself is shown once, when it is created.
 */
export class DeviceToken extends ShopOwnedEntity {
  dyno!: Dyno;
  name!: string;
  tokenHash!: string;
  createdBy: User | null = null;
  lastUsedAt: Date | null = null;
  revokedAt: Date | null = null;
}

export const DeviceTokenSchema = new EntitySchema<DeviceToken, ShopOwnedEntity>({
  class: DeviceToken,
  extends: ShopOwnedSchema,
  tableName: 'device_token',
  indexes: [{ properties: ['shop', 'dyno'] }],
  properties: {
    dyno: { kind: 'm:1', entity: () => Dyno, deleteRule: 'cascade' },
    name: { type: 'string', length: 100 },
    tokenHash: { type: 'string', length: 64, unique: true },
    createdBy: { kind: 'm:1', entity: () => User, nullable: true, deleteRule: 'set null' },
    lastUsedAt: { type: 'datetime', columnType: 'timestamptz', nullable: true },
    revokedAt: { type: 'datetime', columnType: 'timestamptz', nullable: true },
  },
});
