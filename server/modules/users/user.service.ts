import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { AppError, conflict, notFound } from '../../lib/errors';
import { tenantScope } from '../../http/tenant-scope';
import { wholePage, type Page } from '@shared/schemas/common';
import type { Mailer } from '../../lib/mail/mailer';
import type { InviteUserInput, UserDto } from '@shared/schemas/auth';
import type { Role } from '@shared/roles';
import { AuthToken, User } from './user.entity';
import { ShareLink } from '../reports/report.entity';
import { Customer } from '../customers/customer.entity';
import { Shop } from '../shops/shop.entity';
import { issueToken } from '../auth/auth.service';
import { recordAudit } from '../audit/audit.service';

export type { UserDto };

export const toUserDto = (u: User): UserDto => ({
  id: u.id,
  email: u.email,
  name: u.name,
  role: u.role,
  disabled: u.disabled,
  invitePending: !u.passwordHash,
  customerId: u.customer?.id ?? null,
  lastLoginAt: u.lastLoginAt?.toISOString() ?? null,
});

/** The shop's sign-ins, by role then name: a short list by nature, answered whole. */
export async function listUsers(em: EntityManager, actor: Actor): Promise<Page<UserDto>> {
  const users = await em.find(User, tenantScope<User>(actor), { orderBy: { role: 'asc', name: 'asc' } });
  return wholePage(users.map(toUserDto));
}

/** Mails the invitation link; called after the token's transaction has committed. */
async function sendInvite(mailer: Mailer, publicUrl: string, user: User, shopName: string, token: string) {
  const link = `${publicUrl.replace(/\/$/, '')}/invite/${token}`;
  await mailer.send({
    shopId: user.shop.id,
    to: user.email,
    subject: `You're invited to ${shopName} on Pullbook`,
    text: `Hello ${user.name},\n\n${shopName} has given you a Pullbook account. Open this link within 7 days to choose your password:\n\n${link}\n`,
  });
}

/** Create a user without a password and e-mail them a link to set one. */
export async function inviteUser(em: EntityManager, mailer: Mailer, publicUrl: string, actor: Actor, input: InviteUserInput): Promise<UserDto> {
  if (await em.findOne(User, { email: input.email })) {
    throw conflict('EMAIL_TAKEN', 'A user with that e-mail address already exists');
  }
  let customer: Customer | null = null;
  if (input.role === 'customer') {
    if (!input.customerId) throw new AppError('CUSTOMER_REQUIRED', 'Choose which customer record this sign-in belongs to', 400, { fields: [{ path: 'customerId', message: 'Required for customers' }] });
    customer = await em.findOne(Customer, tenantScope<Customer>(actor, undefined, { id: input.customerId }));
    if (!customer) throw notFound('Customer');
  }
  const shop = await em.findOneOrFail(Shop, actor.shopId);
  const { user, token } = await em.transactional(async (tx) => {
    const created = tx.create(User, { shop, email: input.email, name: input.name, role: input.role, customer } as User);
    const issued = await issueToken(tx, created, 'invite');
    await recordAudit(tx, actor, 'user.invite', 'user', created.id, { email: created.email, role: created.role });
    return { user: created, token: issued };
  });
  await sendInvite(mailer, publicUrl, user, shop.name, token);
  return toUserDto(user);
}

export async function resendInvite(em: EntityManager, mailer: Mailer, publicUrl: string, actor: Actor, id: string) {
  const user = await em.findOne(User, tenantScope<User>(actor, undefined, { id }), { populate: ['shop'] });
  if (!user) throw notFound('User');
  if (user.passwordHash) throw conflict('ALREADY_ACTIVE', 'This user has already set a password');
  const token = await em.transactional(async (tx) => {
    const issued = await issueToken(tx, user, 'invite');
    await recordAudit(tx, actor, 'user.resend-invite', 'user', user.id, { email: user.email });
    return issued;
  });
  await sendInvite(mailer, publicUrl, user, user.shop.name, token);
}

export async function updateUser(em: EntityManager, actor: Actor, id: string, patch: { name?: string; role?: Role; disabled?: boolean }): Promise<UserDto> {
  const user = await em.transactional(async (tx) => {
    const found = await tx.findOne(User, tenantScope<User>(actor, undefined, { id }));
    if (!found) throw notFound('User');
    if (found.id === actor.id && (patch.disabled || (patch.role && patch.role !== 'owner'))) {
      throw new AppError('CANNOT_DEMOTE_SELF', 'You cannot disable yourself or give up the owner role; ask another owner', 400);
    }
    if (patch.role === 'customer' && !found.customer) {
      throw new AppError('CUSTOMER_REQUIRED', 'A customer sign-in must belong to a customer record; invite them from the customer page', 400);
    }
    const before = { name: found.name, role: found.role, disabled: found.disabled };
    if (patch.name !== undefined) found.name = patch.name;
    if (patch.role !== undefined) found.role = patch.role;
    if (patch.disabled !== undefined) found.disabled = patch.disabled;
    if (patch.disabled && !before.disabled) {
      // A disabled user's share links stop working and their unused invitation or reset links die
      // (for good: enabling the user again brings neither back).
      const now = new Date();
      await tx.nativeUpdate(ShareLink, { createdBy: found.id, revokedAt: null }, { revokedAt: now });
      await tx.nativeUpdate(AuthToken, { user: found.id, usedAt: null }, { usedAt: now });
    }
    await recordAudit(tx, actor, 'user.update', 'user', found.id, { before, after: { name: found.name, role: found.role, disabled: found.disabled } });
    return found;
  });
  if (patch.disabled) {
    // Signed-in sessions of a disabled user end at their next request (deserializeUser refuses
    // them); removing them here also frees the rows.
    await em.getConnection().execute(`delete from http_session where sess->'passport'->>'user' = ?`, [user.id]);
  }
  return toUserDto(user);
}
