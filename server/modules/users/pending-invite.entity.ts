import { EntitySchema } from '@mikro-orm/core';
import { ShopOwnedEntity, ShopOwnedSchema } from '../../db/base-entity';
import type { Role } from '@shared/roles';
import { Customer } from '../customers/customer.entity';

/**
 * An invitation to an address that already signs in at another shop (addresses are unique across
 * Pullbook). No account is made, but the inviting shop keeps seeing the invitation exactly as it
 * sees any other one waiting to be accepted: in its users list, on the customer's page, with
 * resend and disable. Otherwise a reload would tell it that the address is known elsewhere.
 */
export class PendingInvite extends ShopOwnedEntity {
  email!: string;
  name!: string;
  role!: Role;
  disabled = false;
  customer: Customer | null = null;
}

export const PendingInviteSchema = new EntitySchema<PendingInvite, ShopOwnedEntity>({
  class: PendingInvite,
  extends: ShopOwnedSchema,
  tableName: 'pending_invite',
  uniques: [{ properties: ['shop', 'email'] }],
  properties: {
    email: { type: 'string', length: 320 },
    name: { type: 'string', length: 200 },
    role: { type: 'string', length: 16 },
    disabled: { type: 'boolean', default: false },
    customer: { kind: 'm:1', entity: () => Customer, nullable: true, deleteRule: 'set null' },
  },
});
