import express from 'express';
import fs from 'node:fs';
import path from 'node:path';
import compression from 'compression';
import { RequestContext } from '@mikro-orm/core';
import type { AppDeps } from './app-deps';
import { installSessions } from './http/session';
import { sameOriginOnly } from './middleware/same-origin';
import { errorHandler } from './middleware/error-handler';
import { allRouters } from './modules';
import type { RegisteredRoute } from './http/api-router';
import { AppError } from './lib/errors';
import { httpLogger } from './lib/logger';
import { deviceBearerGate } from './modules/device/device-auth';
import { closeLiveFeed } from './lib/live/live-feed';
import { PAYMENT_WEBHOOK_PATH } from './modules/plans/plan.routes';
import { framableBySelf, securityHeaders } from './middleware/security-headers';
import { contentEncodingGuard } from './middleware/content-encoding';

/** TRUST_PROXY as Express takes it: false/true, a hop count, or addresses and subnets. */
export function trustProxySetting(value: string): boolean | number | string {
  if (value === 'false' || value === '') return false;
  if (value === 'true') return true;
  if (/^\d+$/.test(value)) return Number(value);
  return value;
}

export interface CreatedApp {
  app: express.Express;
  /** Every API route with its access rule (the route × role test reads this). */
  routes: RegisteredRoute[];
  close(): Promise<void>;
}

/**
 * Build the Express app from its dependencies. Never listens: server/main.ts does that, and
 * tests drive the app through supertest.
 */
export function createApp(deps: AppDeps, opts: { clientDir?: string } = {}): CreatedApp {
  const app = express();
  app.disable('x-powered-by');
  app.set('query parser', 'extended');
  app.set('trust proxy', trustProxySetting(deps.config.TRUST_PROXY));

  // One JSON line per request (request id, user, shop, status, time); the id is answered in X-Request-Id.
  app.use(httpLogger());
  // Text answers (JSON, HTML, JS, CSS) go compressed to clients that accept it.
  app.use(compression());
  // CSP, frame-ancestors 'none', Permissions-Policy, nosniff, HSTS on https (middleware/security-headers.ts).
  app.use(securityHeaders({ publicUrl: deps.config.PUBLIC_URL, devServer: deps.config.NODE_ENV === 'development' && !opts.clientDir }));
  const framedPdf = /^\/api\/(?:reports|share)\/[^/]+\/pdf$/;
  app.use((req, res, next) => (framedPdf.test(req.path) ? framableBySelf(req, res, next) : next()));
  app.use((req, res, next) => {
    res.locals.requestId = String(req.id);
    next();
  });
  app.use('/api', contentEncodingGuard);
  // The payment webhook's signature covers the exact bytes: its body stays raw (the JSON parsers skip a parsed body).
  app.use(PAYMENT_WEBHOOK_PATH, express.raw({ type: '*/*', limit: '1mb' }));
  // Sign-in and account bodies are a few fields: a small cap keeps a large (deeply nested) body
  // from costing the event loop a parse before any check. The 2 MB parser skips bodies parsed here.
  app.use('/api/auth', express.json({ limit: '16kb' }));
  app.use('/api', express.json({ limit: '2mb' }));
  app.use('/api', sameOriginOnly(deps.config.PUBLIC_URL));
  // One EntityManager per request; services get it explicitly, never a global.
  app.use((_req, res, next) => {
    const em = deps.orm.em.fork();
    res.locals.em = em;
    RequestContext.create(em, next);
  });
  // Device tokens (Bearer) are read before sessions and accepted on the device upload route only.
  app.use(deviceBearerGate());
  const sessions = installSessions(app, deps);

  const routers = allRouters(deps);
  for (const r of routers) app.use(r.prefix, r.router);
  app.use('/api', (req, _res, next) => next(new AppError('NOT_FOUND', `No API route ${req.method} ${req.path}`, 404)));

  if (opts.clientDir && fs.existsSync(path.join(opts.clientDir, 'index.html'))) {
    const clientDir = opts.clientDir;
    // Source maps are built (hidden) for error reports but never served.
    app.use((req, _res, next) => next(req.path.endsWith('.map') ? new AppError('NOT_FOUND', 'Not found', 404) : undefined));
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
    // Client-side routes (including the public /share/:token page) get the app shell.
    app.get('/{*splat}', (_req, res) => res.sendFile(path.join(clientDir, 'index.html')));
  }
  app.use(errorHandler());

  return {
    app,
    routes: routers.flatMap((r) => r.routes),
    close: async () => {
      await Promise.all([sessions.close(), closeLiveFeed(deps)]);
    },
  };
}
