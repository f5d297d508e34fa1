import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { AppError, conflict, notFound } from '../../lib/errors';
import { tenantScope } from '../../http/tenant-scope';
import { wholePage, type Page } from '@shared/schemas/common';
import { enqueueMail } from '../../lib/mail/mail-queue';
import type { InviteUserInput, UserDto } from '@shared/schemas/auth';
import type { Role } from '@shared/roles';
import { AuthToken, User } from './user.entity';
import { PendingInvite } from './pending-invite.entity';
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

/** An invitation to an address of another shop, shown as any invitation waiting to be accepted. */
const pendingToUserDto = (p: PendingInvite): UserDto => ({
  id: p.id,
  email: p.email,
  name: p.name,
  role: p.role,
  disabled: p.disabled,
  invitePending: true,
  customerId: p.customer?.id ?? null,
  lastLoginAt: null,
});

/** The shop's sign-ins, by role then name: a short list by nature, answered whole. */
export async function listUsers(em: EntityManager, actor: Actor): Promise<Page<UserDto>> {
  const users = await em.find(User, tenantScope<User>(actor));
  const pending = await em.find(PendingInvite, tenantScope<PendingInvite>(actor));
  const all = [...users.map(toUserDto), ...pending.map(pendingToUserDto)];
  all.sort((x, y) => (x.role === y.role ? x.name.localeCompare(y.name) : x.role < y.role ? -1 : 1));
  return wholePage(all);
}

/** Queues the invitation mail in the transaction `tx` that issued its token (sent once it commits). */
async function queueInvite(tx: EntityManager, publicUrl: string, user: User, shopName: string, token: string) {
  const link = `${publicUrl.replace(/\/$/, '')}/invite/${token}`;
  await enqueueMail(tx, {
    shopId: user.shop.id,
    kind: 'invite',
    to: user.email,
    subject: `You're invited to ${shopName} on Pullbook`,
    text: `Hello ${user.name},\n\n${shopName} has given you a Pullbook account. Open this link within 7 days to choose your password:\n\n${link}\n`,
  });
}

/** Create a user without a password and e-mail them a link to set one. */
export async function inviteUser(em: EntityManager, publicUrl: string, actor: Actor, input: InviteUserInput): Promise<UserDto> {
  const email = input.email.trim().toLowerCase();
  const existing = await em.findOne(User, { email }, { populate: ['shop'] });
  const pendingHere = await em.count(PendingInvite, { shop: actor.shopId, email });
  if ((existing && existing.shop.id === actor.shopId) || pendingHere) {
    throw conflict('EMAIL_TAKEN', 'A user with that e-mail address already exists');
  }
  let customer: Customer | null = null;
  if (input.role === 'customer') {
    if (!input.customerId) throw new AppError('CUSTOMER_REQUIRED', 'Choose which customer record this sign-in belongs to', 400, { fields: [{ path: 'customerId', message: 'Required for customers' }] });
    customer = await em.findOne(Customer, tenantScope<Customer>(actor, undefined, { id: input.customerId }));
    if (!customer) throw notFound('Customer');
  }
  const shop = await em.findOneOrFail(Shop, actor.shopId);
  if (existing) return inviteAccountOfAnotherShop(em, publicUrl, actor, shop, existing, input);
  const user = await em.transactional(async (tx) => {
    const created = tx.create(User, { shop, email: input.email, name: input.name, role: input.role, customer } as User);
    const issued = await issueToken(tx, created, 'invite');
    await recordAudit(tx, actor, 'user.invite', 'user', created.id, { email: created.email, role: created.role });
    await queueInvite(tx, publicUrl, created, shop.name, issued);
    return created;
  });
  return toUserDto(user);
}

/** Tells the owner of an address that already signs in elsewhere that this shop invited it. */
async function queueElsewhereNotice(tx: EntityManager, publicUrl: string, shopId: string, shopName: string, email: string) {
  await enqueueMail(tx, {
    shopId,
    kind: 'invite',
    to: email,
    subject: `${shopName} invited you to Pullbook`,
    text: `Hello,\n\n${shopName} tried to give this address a Pullbook sign-in, but it already has one. If you want a separate sign-in for ${shopName}, ask them to invite another address of yours.\n\nSign in as usual at ${publicUrl.replace(/\/$/, '')}/login\n`,
  });
}

/**
 * The address already signs in at another shop (addresses are unique across Pullbook). The
 * inviting shop gets the same answer as for a new address, and keeps seeing the invitation as
 * pending (a PendingInvite row), so neither the answer nor a reload tells whether the address is
 * known elsewhere. The address's owner gets a notice instead of a link.
 */
async function inviteAccountOfAnotherShop(em: EntityManager, publicUrl: string, actor: Actor, shop: Shop, existing: User, input: InviteUserInput): Promise<UserDto> {
  const pending = await em.transactional(async (tx) => {
    const customer = input.customerId ? tx.getReference(Customer, input.customerId) : null;
    const row = tx.create(PendingInvite, { shop, email: existing.email, name: input.name, role: input.role, customer } as PendingInvite);
    await recordAudit(tx, actor, 'user.invite', 'user', row.id, { email: row.email, role: row.role });
    await queueElsewhereNotice(tx, publicUrl, actor.shopId, shop.name, existing.email);
    return row;
  });
  return pendingToUserDto(pending);
}

/**
 * Resending an invitation to an address of another shop: the notice again, or, when that address
 * no longer signs in anywhere, the real invitation (the pending row becomes the user).
 */
async function resendPendingInvite(em: EntityManager, publicUrl: string, actor: Actor, pending: PendingInvite): Promise<void> {
  const shop = await em.findOneOrFail(Shop, actor.shopId);
  await em.transactional(async (tx) => {
    await recordAudit(tx, actor, 'user.resend-invite', 'user', pending.id, { email: pending.email });
    if (await tx.count(User, { email: pending.email })) {
      await queueElsewhereNotice(tx, publicUrl, actor.shopId, shop.name, pending.email);
      return;
    }
    const user = tx.create(User, { id: pending.id, shop, email: pending.email, name: pending.name, role: pending.role, customer: pending.customer, disabled: pending.disabled } as User);
    tx.remove(tx.getReference(PendingInvite, pending.id));
    const issued = await issueToken(tx, user, 'invite');
    await queueInvite(tx, publicUrl, user, shop.name, issued);
  });
}

export async function resendInvite(em: EntityManager, publicUrl: string, actor: Actor, id: string) {
  const user = await em.findOne(User, tenantScope<User>(actor, undefined, { id }), { populate: ['shop'] });
  if (!user) {
    const pending = await em.findOne(PendingInvite, tenantScope<PendingInvite>(actor, undefined, { id }));
    if (!pending) throw notFound('User');
    return resendPendingInvite(em, publicUrl, actor, pending);
  }
  if (user.passwordHash) throw conflict('ALREADY_ACTIVE', 'This user has already set a password');
  await em.transactional(async (tx) => {
    const issued = await issueToken(tx, user, 'invite');
    await recordAudit(tx, actor, 'user.resend-invite', 'user', user.id, { email: user.email });
    // The earlier invitation's link no longer works: a copy still waiting is not sent.
    await tx.getConnection().execute(
      `update mail_message set status = 'failed', last_error = 'Replaced by a newer invitation', body = null, updated_at = now()
       where shop_id = ? and kind = 'invite' and lower(recipient) = lower(?) and status = 'queued'`,
      [actor.shopId, user.email],
      'all',
      tx.getTransactionContext(),
    );
    await queueInvite(tx, publicUrl, user, user.shop.name, issued);
  });
}

export async function updateUser(em: EntityManager, actor: Actor, id: string, patch: { name?: string; role?: Role; disabled?: boolean }): Promise<UserDto> {
  const pending = await em.findOne(PendingInvite, tenantScope<PendingInvite>(actor, undefined, { id }));
  if (pending) return updatePendingInvite(em, actor, pending, patch);
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

/** The same edits on an invitation to an address of another shop, with the same rules and audit. */
async function updatePendingInvite(em: EntityManager, actor: Actor, pending: PendingInvite, patch: { name?: string; role?: Role; disabled?: boolean }): Promise<UserDto> {
  if (patch.role === 'customer' && !pending.customer) {
    throw new AppError('CUSTOMER_REQUIRED', 'A customer sign-in must belong to a customer record; invite them from the customer page', 400);
  }
  await em.transactional(async (tx) => {
    const before = { name: pending.name, role: pending.role, disabled: pending.disabled };
    tx.assign(pending, Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined)));
    await tx.persist(pending).flush();
    await recordAudit(tx, actor, 'user.update', 'user', pending.id, { before, after: { name: pending.name, role: pending.role, disabled: pending.disabled } });
  });
  return pendingToUserDto(pending);
}
