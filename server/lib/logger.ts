/**
 * The server's one logger: pino, one JSON line per event, to stdout. The HTTP access log
 * (`httpLogger`, pino-http) writes one line per request with its request id, the signed-in user
 * and shop, the status and the time taken. Secrets never reach the log: credentials, cookies and
 * tokens are redacted by path, and token-bearing URLs (share links, invitations, resets) are
 * written with the token replaced.
 */
import { randomUUID } from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';
import pino, { type DestinationStream, type Logger } from 'pino';
import { pinoHttp } from 'pino-http';

/** Paths pino replaces with "[redacted]" wherever they occur in a logged object. */
export const REDACTED_PATHS = [
  'req.headers.authorization',
  'req.headers.cookie',
  'req.headers["x-device-token"]',
  'res.headers["set-cookie"]',
  '*.password',
  '*.currentPassword',
  '*.newPassword',
  '*.token',
  '*.secret',
  '*.apiKey',
  'err.config.headers',
];

/** URL paths whose last part is a secret token. */
const TOKEN_URL = /^(\/(?:api\/)?(?:share|invite|reset-password|auth\/token|plans\/link)\/)[^/?#]+/;

/** A URL fit for the log: tokens in the path and the query (`?token=`) replaced. */
export function safeUrl(url: string): string {
  return url.replace(TOKEN_URL, '$1[redacted]').replace(/([?&](?:token|key|signature)=)[^&#]*/gi, '$1[redacted]');
}

export function createLogger(opts: { level?: string; destination?: DestinationStream } = {}): Logger {
  return pino(
    {
      level: opts.level ?? process.env.LOG_LEVEL ?? 'info',
      base: { service: 'pullbook' },
      redact: { paths: REDACTED_PATHS, censor: '[redacted]' },
      timestamp: pino.stdTimeFunctions.isoTime,
      formatters: { level: (label) => ({ level: label }) },
    },
    opts.destination,
  );
}

/** The process-wide logger. Tests and the CLIs may create their own with `createLogger`. */
export const logger = createLogger();

interface SignedIn {
  id?: string;
  shopId?: string;
}

/**
 * Access log middleware. Reuses an `X-Request-Id` from a trusted proxy when it looks sane,
 * otherwise makes one; the id is also answered in the `X-Request-Id` header and kept in
 * `res.locals.requestId` for error messages.
 */
export function httpLogger(base: Logger = logger) {
  return pinoHttp({
    logger: base,
    genReqId: (req: IncomingMessage, res: ServerResponse) => {
      const given = req.headers['x-request-id'];
      const id = typeof given === 'string' && /^[\w.-]{1,64}$/.test(given) ? given : randomUUID().slice(0, 8);
      res.setHeader('X-Request-Id', id);
      return id;
    },
    customProps: (req: IncomingMessage) => {
      const user = (req as IncomingMessage & { user?: SignedIn }).user;
      return { userId: user?.id ?? null, shopId: user?.shopId ?? null };
    },
    customLogLevel: (_req, res, err) => (err || res.statusCode >= 500 ? 'error' : res.statusCode >= 400 ? 'warn' : 'info'),
    serializers: {
      req: (req: { id: string; method: string; url: string }) => ({ id: req.id, method: req.method, url: safeUrl(req.url) }),
      res: (res: { statusCode: number }) => ({ status: res.statusCode }),
    },
    // Health probes every few seconds would drown the log.
    autoLogging: { ignore: (req) => req.url === '/api/health' && req.method === 'GET' },
  });
}
