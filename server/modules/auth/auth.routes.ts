import passport from 'passport';
import type { Request, RequestHandler } from 'express';
import { ApiRouter, reply } from '../../http/api-router';
import { SESSION_COOKIE } from '../../http/session';
import type { AppDeps } from '../../app-deps';
import { AppError } from '../../lib/errors';
import { changePasswordInput, forgotPasswordInput, loginInput, setPasswordInput, type ForgotPasswordDto, type SignedInUser, type SignInDto, type TokenInfoDto } from '@shared/schemas/auth';
import type { OkDto } from '@shared/schemas/common';
import { changePassword, consumeToken, limitResetRequests, peekToken, toActor } from './auth.service';
import { queueResetRequest } from './account-mail';
import type { Actor } from '../../http/actor';
import type { User } from '../users/user.entity';
import { z } from 'zod';

function logIn(req: Request, user: User): Promise<Actor> {
  const actor = toActor(user);
  // passport ≥ 0.6 regenerates the session id here, so a planted id is never promoted.
  return new Promise((resolve, reject) => req.login(actor, (err) => (err ? reject(err) : resolve(actor))));
}

/** The user passport-local found for this sign-in request (set by `checkPassword`). */
type SignInRequest = Request & { signInUser?: User | false };

/**
 * Runs passport-local's strategy (http/session.ts) before the handler. A body that is not even
 * shaped like a sign-in is left to the route's validation, which answers 400 with field messages.
 */
const checkPassword: RequestHandler = (req, res, next) => {
  if (!loginInput.safeParse(req.body).success) return next();
  passport.authenticate('local', { session: false }, (err: unknown, u: User | false) => {
    if (err) return next(err);
    (req as SignInRequest).signInUser = u;
    next();
  })(req, res, next);
};

export function authRoutes(deps: AppDeps) {
  const api = new ApiRouter('/api/auth', deps);

  api.route({
    method: 'post',
    path: '/login',
    access: 'public',
    summary: 'Sign in with e-mail and password',
    body: loginInput,
    before: [checkPassword],
    handler: async ({ req }): Promise<SignInDto> => {
      const user = (req as SignInRequest).signInUser;
      if (!user) throw new AppError('BAD_CREDENTIALS', 'E-mail or password is not right', 401);
      return { user: await logIn(req, user) };
    },
  });

  api.route({
    method: 'post',
    path: '/logout',
    access: 'public',
    summary: 'Sign out',
    handler: async ({ req }) => {
      const body: OkDto = { ok: true };
      await new Promise<void>((resolve, reject) => req.logout((err) => (err ? reject(err) : resolve())));
      await new Promise<void>((resolve) => req.session.destroy(() => resolve()));
      return reply(body, { clearCookies: [SESSION_COOKIE] });
    },
  });

  api.route({
    method: 'get',
    path: '/me',
    access: 'signed-in',
    summary: 'The signed-in user',
    handler: async ({ actor }): Promise<SignedInUser> => actor,
  });

  api.route({
    method: 'post',
    path: '/password',
    access: 'signed-in',
    summary: 'Change own password',
    body: changePasswordInput,
    handler: async ({ em, actor, body, req }): Promise<OkDto> => {
      await changePassword(em, actor, body.currentPassword, body.newPassword, deps.config.BCRYPT_ROUNDS, req.sessionID);
      return { ok: true };
    },
  });

  api.route({
    method: 'post',
    path: '/forgot',
    access: 'public',
    summary: 'E-mail a password reset link',
    body: forgotPasswordInput,
    status: 202,
    handler: async ({ em, body, req }): Promise<ForgotPasswordDto> => {
      const startedAt = Date.now();
      await limitResetRequests(em, body.email, req.ip ?? 'unknown');
      await queueResetRequest(deps, em, body.email, startedAt);
      return { ok: true, message: 'If that address has an account, a reset link is on its way.' };
    },
  });

  api.route({
    method: 'get',
    path: '/token/:token',
    access: 'public',
    summary: 'Check an invitation or reset link',
    params: z.object({ token: z.string().min(20).max(200) }),
    handler: async ({ em, params }): Promise<TokenInfoDto> => {
      const row = await peekToken(em, params.token);
      return { purpose: row.purpose, email: row.user.email, name: row.user.name };
    },
  });

  api.route({
    method: 'post',
    path: '/set-password',
    access: 'public',
    summary: 'Set a password from an invitation or reset link, then sign in',
    body: setPasswordInput,
    handler: async ({ em, body, req }): Promise<SignInDto> => {
      const user = await consumeToken(em, body.token, body.password, deps.config.BCRYPT_ROUNDS, body.name);
      return { user: await logIn(req, user) };
    },
  });

  return api;
}
