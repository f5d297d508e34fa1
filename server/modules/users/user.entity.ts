import { EntitySchema } from '@mikro-orm/core';
import { ShopOwnedEntity, ShopOwnedSchema } from '../../db/base-entity';
import { randomUUID } from 'node:crypto';
import type { Role } from '@shared/roles';
import { Customer } from '../customers/customer.entity';

/** Someone who signs in: shop staff, or a customer linked to their customer record. */
export class User extends ShopOwnedEntity {
  email!: string;
  name!: string;
  /** Null until an invited user sets a password. */
  passwordHash: string | null = null;
  role!: Role;
  disabled = false;
  /** Set for role `customer`: whose bikes this user may see. */
  customer: Customer | null = null;
  lastLoginAt: Date | null = null;
}

export type AuthTokenPurpose = 'invite' | 'reset';

/** Single-use, expiring token for an invitation or a password reset. Only its hash is stored. */
export class AuthToken {
  id: string = randomUUID();
  user!: User;
  purpose!: AuthTokenPurpose;
  tokenHash!: string;
  expiresAt!: Date;
  usedAt: Date | null = null;
  createdAt: Date = new Date();
}

export const UserSchema = new EntitySchema<User, ShopOwnedEntity>({
  class: User,
  extends: ShopOwnedSchema,
  tableName: 'app_user',
  indexes: [{ properties: ['shop', 'role'] }],
  properties: {
    email: { type: 'string', length: 320, unique: true },
    name: { type: 'string', length: 200 },
    passwordHash: { type: 'string', length: 100, nullable: true, hidden: true },
    role: { type: 'string', length: 16 },
    disabled: { type: 'boolean', default: false },
    customer: { kind: 'm:1', entity: () => Customer, nullable: true, deleteRule: 'set null' },
    lastLoginAt: { type: 'datetime', columnType: 'timestamptz', nullable: true },
  },
});

export const AuthTokenSchema = new EntitySchema<AuthToken>({
  class: AuthToken,
  tableName: 'auth_token',
  properties: {
    id: { type: 'uuid', primary: true },
    user: { kind: 'm:1', entity: () => User, deleteRule: 'cascade' },
    purpose: { type: 'string', length: 16 },
    tokenHash: { type: 'string', length: 64, unique: true },
    expiresAt: { type: 'datetime', columnType: 'timestamptz' },
    usedAt: { type: 'datetime', columnType: 'timestamptz', nullable: true },
    createdAt: { type: 'datetime', columnType: 'timestamptz' },
  },
});
