/**
 * Mail whose sending must not show whether an account exists. A password-reset request only
 * queues a job (the same work for any address); the job looks the account up and, when there is
 * one, issues the token and queues the mail. So the answer takes the same time and says the same
 * thing for known and unknown addresses, and does not depend on the mail relay being up.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { AppDeps } from '../../app-deps';
import { enqueueMail } from '../../lib/mail/mail-queue';
import { User } from '../users/user.entity';
import { issueToken } from './auth.service';

export type AccountMailJob = { type: 'reset'; email: string };

/** Issues a reset token for the account with that address, if any, and queues its mail. */
export async function sendResetIfAccount(em: EntityManager, publicUrl: string, email: string): Promise<boolean> {
  return em.transactional(async (tx) => {
    const user = await tx.findOne(User, { email: email.trim().toLowerCase(), disabled: false });
    if (!user) return false;
    const token = await issueToken(tx, user, 'reset');
    const link = `${publicUrl.replace(/\/$/, '')}/reset-password/${token}`;
    await enqueueMail(tx, {
      shopId: user.shop.id,
      kind: 'reset',
      to: user.email,
      subject: 'Reset your Pullbook password',
      text: `Hello ${user.name},\n\nSomeone (hopefully you) asked to reset your Pullbook password. Open this link within an hour to choose a new one:\n\n${link}\n\nIf you did not ask, ignore this message; your password stays as it is.\n`,
    });
    return true;
  });
}

/** The worker for the `accountMail` queue (started with the mail worker, server/main.ts). */
export function accountMailWorker(deps: AppDeps) {
  return {
    queue: 'accountMail' as const,
    handler: async (data: object) => {
      const job = data as AccountMailJob;
      if (job.type === 'reset') await sendResetIfAccount(deps.orm.em.fork(), deps.config.PUBLIC_URL, job.email);
    },
  };
}

/** Every reset answer takes at least this long, so its timing tells nothing (our choice). */
export const RESET_ANSWER_MS = 300;

/**
 * What POST /api/auth/forgot does after its rate limits: queue the look-up, then wait until
 * RESET_ANSWER_MS has passed since `startedAt`. Without a running worker (a CLI), the look-up
 * runs here, still inside the padded time.
 */
export async function queueResetRequest(deps: AppDeps, em: EntityManager, email: string, startedAt: number): Promise<void> {
  const job: AccountMailJob = { type: 'reset', email: email.trim().toLowerCase() };
  if (!(await deps.mail.queueJob('accountMail', job))) await sendResetIfAccount(em, deps.config.PUBLIC_URL, job.email);
  const left = RESET_ANSWER_MS - (Date.now() - startedAt);
  if (left > 0) await new Promise((r) => setTimeout(r, left));
}
