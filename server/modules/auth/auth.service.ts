import bcrypt from 'bcrypt';
import { createHash, randomBytes } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/postgresql';
import { AppError } from '../../lib/errors';
import { hitRateLimit, resetRateLimit } from '../../lib/rate-limit';
import { beginSignInAttempt, signInSucceeded } from '../../lib/login-throttle';
import type { Actor } from '../../http/actor';
import { AuthToken, User, type AuthTokenPurpose } from '../users/user.entity';
import { judgePassword } from '@shared/password-policy';

/** Wrong current passwords allowed on the change form per user in 15 minutes (our own limit, like sign-in's). */
export const CHANGE_PASSWORD_LIMIT = { limit: 5, windowSeconds: 15 * 60 };
const TOKEN_LIFETIME_MS: Record<AuthTokenPurpose, number> = {
  invite: 7 * 24 * 3600 * 1000,
  reset: 60 * 60 * 1000,
};

export const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');

export function toActor(user: User): Actor {
  return {
    id: user.id,
    shopId: user.shop.id,
    role: user.role,
    email: user.email,
    name: user.name,
    customerId: user.customer?.id ?? null,
  };
}

export async function hashPassword(password: string, rounds: number) {
  return bcrypt.hash(password, rounds);
}

// A real hash to compare against when the account does not exist, so timing does not tell.
const DUMMY_HASH = bcrypt.hashSync('not-a-real-password', 10);

/**
 * Check an e-mail and password. Throttled (lib/login-throttle.ts) before any hashing: per account
 * and address, per account from unknown addresses, and per address; a right password takes its
 * attempt back. Returns null on bad credentials.
 */
export async function verifyCredentials(em: EntityManager, email: string, password: string, ip: string): Promise<User | null> {
  const normalized = email.trim().toLowerCase();
  await beginSignInAttempt(em, normalized, ip);
  const user = await em.findOne(User, { email: normalized });
  const ok = await bcrypt.compare(password, user?.passwordHash ?? DUMMY_HASH);
  if (!user || !user.passwordHash || !ok || user.disabled) return null;
  await signInSucceeded(em, normalized, ip);
  user.lastLoginAt = new Date();
  await em.flush();
  return user;
}

/** Issue a single-use token; only its hash is stored. Returns the token to put in the link. */
export async function issueToken(em: EntityManager, user: User, purpose: AuthTokenPurpose): Promise<string> {
  const token = randomBytes(32).toString('base64url');
  // An older unused token of the same purpose stops working when a new one is issued.
  await em.nativeUpdate(AuthToken, { user, purpose, usedAt: null }, { usedAt: new Date() });
  em.create(AuthToken, { user, purpose, tokenHash: hashToken(token), expiresAt: new Date(Date.now() + TOKEN_LIFETIME_MS[purpose]) } as AuthToken);
  await em.flush();
  return token;
}

const badToken = () => new AppError('TOKEN_INVALID', 'This link is invalid or has expired; ask for a new one', 400);

/** Find a live token without using it up (for the set-password page to show whose it is). */
export async function peekToken(em: EntityManager, token: string) {
  const row = await em.findOne(AuthToken, { tokenHash: hashToken(token) }, { populate: ['user'] });
  if (!row || row.usedAt || row.expiresAt < new Date() || row.user.disabled) throw badToken();
  return row;
}

/**
 * Refuses a new password the policy (src/shared/password-policy.ts) judges too weak, or built from
 * the person's own name or e-mail, with a field message on `field`.
 */
export function assertStrongPassword(password: string, userInputs: string[], field: string) {
  const { ok, problem } = judgePassword(password, userInputs);
  if (ok) return;
  const message = problem ?? 'Choose a stronger password.';
  throw new AppError('VALIDATION_FAILED', `Invalid body: ${field} — ${message}`, 400, { fields: [{ path: field, message }] });
}

/** Signs the user out everywhere except the session `keepSid` (when given). */
export async function endOtherSessions(em: EntityManager, userId: string, keepSid?: string) {
  await em.getConnection().execute(`delete from http_session where sess->'passport'->>'user' = ? and sid <> ?`, [userId, keepSid ?? '']);
}

/** Use a token to set a password (invitation or reset); every session of the user ends. */
export async function consumeToken(em: EntityManager, token: string, password: string, rounds: number, name?: string): Promise<User> {
  const row = await peekToken(em, token);
  assertStrongPassword(password, [row.user.name, row.user.email, ...(name ? [name] : [])], 'password');
  // Mark used atomically so two concurrent submissions cannot both succeed.
  const claimed = await em.nativeUpdate(AuthToken, { id: row.id, usedAt: null }, { usedAt: new Date() });
  if (claimed !== 1) throw badToken();
  row.user.passwordHash = await hashPassword(password, rounds);
  if (name && row.purpose === 'invite') row.user.name = name;
  await em.flush();
  await endOtherSessions(em, row.user.id);
  return row.user;
}

/**
 * Change one's own password. Tries are rate-limited per user before any hashing (a right one
 * clears the count); the user's other sessions end, the one at `currentSid` stays signed in.
 */
export async function changePassword(em: EntityManager, actor: Actor, current: string, next: string, rounds: number, currentSid: string) {
  const limitKey = `password-change:${actor.id}`;
  await hitRateLimit(em, limitKey, CHANGE_PASSWORD_LIMIT, 'Too many wrong passwords; wait a few minutes and try again');
  const user = await em.findOneOrFail(User, actor.id);
  if (!user.passwordHash || !(await bcrypt.compare(current, user.passwordHash))) {
    throw new AppError('PASSWORD_WRONG', 'The current password is not right', 400, { fields: [{ path: 'currentPassword', message: 'Not right' }] });
  }
  await resetRateLimit(em, limitKey);
  assertStrongPassword(next, [user.name, user.email], 'newPassword');
  user.passwordHash = await hashPassword(next, rounds);
  await em.flush();
  await endOtherSessions(em, user.id, currentSid);
}

/**
 * The rate limits of a reset request, per client address and per address asked for (the same
 * for known and unknown accounts); the look-up itself is queued (account-mail.ts).
 */
export async function limitResetRequests(em: EntityManager, email: string, ip: string) {
  await hitRateLimit(em, `reset:ip:${ip}`, { limit: 20, windowSeconds: 3600 }, 'Too many reset requests; try again later');
  await hitRateLimit(em, `reset:account:${email.trim().toLowerCase()}`, { limit: 5, windowSeconds: 3600 }, 'Too many reset requests; try again later');
}
