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
 */
export type Access = readonly Role[] | 'signed-in' | 'public';

type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

export interface HandlerContext<B, Q, P> {
  actor: Actor;
  body: B;
  query: Q;
  params: P;
  em: EntityManager;
  deps: AppDeps;
  req: Request;
  res: Response;
}

export interface RouteSpec<B, Q, P, A extends Access> {
  method: Method;
  path: string;
  access: A;
  /** One line for DEVELOPERS.md-style listings and the route × role test output. */
  summary: string;
  body?: ZodType<B, ZodTypeDef, unknown>;
  query?: ZodType<Q, ZodTypeDef, unknown>;
  params?: ZodType<P, ZodTypeDef, unknown>;
  /** HTTP status on success; default 200. */
  status?: number;
  /** Extra middleware that runs after the access check and before validation (e.g. multer). */
  before?: express.RequestHandler[];
  handler: (ctx: HandlerContext<B, Q, P> & { actor: A extends 'public' ? Actor | null : Actor }) => Promise<unknown>;
}

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
export function checkAccess(access: Access, actor: Actor | null) {
  if (access === 'public') return;
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

  route<B = undefined, Q = undefined, P = Record<string, string>, A extends Access = Access>(spec: RouteSpec<B, Q, P, A>) {
    this.routes.push({ method: spec.method, path: this.prefix + spec.path, access: spec.access, summary: spec.summary });
    const guard: express.RequestHandler = (req, _res, next) => {
      checkAccess(spec.access, (req.user as Actor | undefined) ?? null);
      next();
    };
    const handle: express.RequestHandler = async (req, res) => {
      const params = parseOrThrow(spec.params, req.params, 'path');
      const query = parseOrThrow(spec.query, req.query, 'query');
      const body = parseOrThrow(spec.body, req.body ?? {}, 'request body');
      const em = res.locals.em as EntityManager;
      const result = await spec.handler({
        actor: (req.user as Actor | undefined) ?? null,
        body,
        query,
        params,
        em,
        deps: this.deps,
        req,
        res,
      } as HandlerContext<B, Q, P> & { actor: never });
      if (res.headersSent) return;
      if (result === undefined) res.status(spec.status ?? 204).end();
      else res.status(spec.status ?? 200).json(result);
    };
    this.router[spec.method](spec.path, guard, ...(spec.before ?? []), handle);
    return this;
  }
}
