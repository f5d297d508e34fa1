import express, { type Request, type Response } from 'express';
import type { ZodType, ZodTypeDef } from 'zod';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Role } from '@shared/roles';
import { AppError, forbidden, unauthenticated } from '../lib/errors';
import type { Actor } from './actor';
import type { AppDeps } from '../app-deps';

/**
 * Who may call a route. Deny by default: a route must say one of these.
 * - a list of roles: signed-in users with one of them
 * - 'signed-in': any signed-in user (services still scope by shop and customer)
 * - 'public': anyone, signed in or not (sign-in, health, share links)
 * - 'device': a dyno's sync agent with a device token (Bearer), and nobody else
 */
export type Access = readonly Role[] | 'signed-in' | 'public' | 'device';

type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

export interface HandlerContext<B, Q, P> {
  actor: Actor;
  body: B;
  query: Q;
  params: P;
  em: EntityManager;
  deps: AppDeps;
  /**
   * The request, for what is not JSON input: uploaded files (multer), the client address, and the
   * session in the auth module. Handlers never write the response: they return it.
   */
  req: Request;
}

/** A JSON answer with a status or headers of its own (the route's `status` is the default). */
export class Reply<R> {
  constructor(
    readonly body: R,
    readonly status?: number,
    readonly headers: Record<string, string> = {},
    readonly clearCookies: string[] = [],
  ) {}
}

/** `return reply(body, { status: 503 })` instead of writing to the response. */
export const reply = <R>(body: R, opts: { status?: number; headers?: Record<string, string>; clearCookies?: string[] } = {}) =>
  new Reply(body, opts.status, opts.headers, opts.clearCookies);

interface BaseSpec<B, Q, P, A extends Access> {
  method: Method;
  path: string;
  access: A;
  /** One line for DEVELOPERS.md-style listings and the route × role test output. */
  summary: string;
  body?: ZodType<B, ZodTypeDef, unknown>;
  query?: ZodType<Q, ZodTypeDef, unknown>;
  params?: ZodType<P, ZodTypeDef, unknown>;
  /** HTTP status on success; default 200 (204 when the handler returns nothing). */
  status?: number;
  /** Headers set on every successful answer (e.g. Cache-Control). */
  headers?: Record<string, string>;
  /** Extra middleware that runs after the access check and before validation (e.g. multer). */
  before?: express.RequestHandler[];
}

type ActorFor<A extends Access> = A extends 'public' ? Actor | null : A extends 'device' ? Actor | null : Actor;

/** A JSON route: typed input in, a typed response (or nothing, 204) out. */
export interface JsonRouteSpec<B, Q, P, A extends Access, R> extends BaseSpec<B, Q, P, A> {
  stream?: false;
  handler: (ctx: HandlerContext<B, Q, P> & { actor: ActorFor<A> }) => Promise<R | Reply<R>>;
}

/** A streaming route (file downloads, PDFs, server-sent events): the only kind that writes to `res`. */
export interface StreamRouteSpec<B, Q, P, A extends Access> extends BaseSpec<B, Q, P, A> {
  stream: true;
  handler: (ctx: HandlerContext<B, Q, P> & { actor: ActorFor<A>; res: Response }) => Promise<void>;
}

export type RouteSpec<B, Q, P, A extends Access, R> = JsonRouteSpec<B, Q, P, A, R> | StreamRouteSpec<B, Q, P, A>;

export interface RegisteredRoute {
  method: Method;
  path: string;
  access: Access;
  summary: string;
}

function zodDetails(err: { issues: { path: (string | number)[]; message: string }[] }) {
  return {
    fields: err.issues.map((i) => ({ path: i.path.join('.'), message: i.message })),
  };
}

function parseOrThrow<T>(schema: ZodType<T, ZodTypeDef, unknown> | undefined, value: unknown, where: string): T {
  if (!schema) return value as T;
  const result = schema.safeParse(value);
  if (!result.success) {
    const details = zodDetails(result.error);
    const first = details.fields[0];
    throw new AppError('VALIDATION_FAILED', `Invalid ${where}: ${first ? `${first.path || where} — ${first.message}` : 'bad input'}`, 400, details);
  }
  return result.data;
}

/** Checks the caller against a route's access rule: 401 when signed out, 403 for a wrong role. */
export function checkAccess(access: Access, actor: Actor | null, isDevice = false) {
  if (access === 'public') return;
  if (access === 'device') {
    // A person is never a device: signed in, the answer is 403; signed out and without a token, 401.
    if (isDevice) return;
    if (actor) throw forbidden('Only a dyno’s sync agent (device token) may use this route');
    throw unauthenticated();
  }
  if (isDevice) throw forbidden();
  if (!actor) throw unauthenticated();
  if (access === 'signed-in') return;
  if (!access.includes(actor.role)) throw forbidden();
}

/**
 * Collects a domain's routes. Every route goes through `route()`, which records it in the
 * registry (the route × role test enumerates that), checks access before anything else, then
 * validates params, query and body with the shared zod schemas.
 */
export class ApiRouter {
  readonly router = express.Router({ mergeParams: true });
  readonly routes: RegisteredRoute[] = [];

  constructor(
    readonly prefix: string,
    private readonly deps: AppDeps,
  ) {}

  route<B = undefined, Q = undefined, P = Record<string, string>, A extends Access = Access, R = unknown>(spec: RouteSpec<B, Q, P, A, R>) {
    this.routes.push({ method: spec.method, path: this.prefix + spec.path, access: spec.access, summary: spec.summary });
    const guard: express.RequestHandler = (req, res, next) => {
      checkAccess(spec.access, (req.user as Actor | undefined) ?? null, res.locals.device !== undefined);
      next();
    };
    const handle: express.RequestHandler = async (req, res) => {
      const params = parseOrThrow(spec.params, req.params, 'path');
      const query = parseOrThrow(spec.query, req.query, 'query');
      const body = parseOrThrow(spec.body, req.body ?? {}, 'request body');
      const ctx = {
        actor: spec.access === 'device' ? null : ((req.user as Actor | undefined) ?? null),
        body,
        query,
        params,
        em: res.locals.em as EntityManager,
        deps: this.deps,
        req,
      } as HandlerContext<B, Q, P> & { actor: never };
      if (spec.stream) {
        if (spec.headers) res.set(spec.headers);
        await spec.handler({ ...ctx, res });
        return;
      }
      const result = await spec.handler(ctx);
      if (res.headersSent) return;
      const answer = result instanceof Reply ? result : new Reply(result);
      res.set({ ...spec.headers, ...answer.headers });
      for (const name of answer.clearCookies) res.clearCookie(name);
      if (answer.body === undefined) res.status(answer.status ?? spec.status ?? 204).end();
      else res.status(answer.status ?? spec.status ?? 200).json(answer.body);
    };
    this.router[spec.method](spec.path, guard, ...(spec.before ?? []), handle);
    return this;
  }
}
