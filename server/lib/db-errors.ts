/**
 * Recognises the errors that mean "PostgreSQL cannot be reached right now" (refused or cut
 * connection, server shutting down or starting, pool timeouts), as opposed to a failed query.
 * Such a request answers 503 DATABASE_UNAVAILABLE; the pools reconnect on their own.
 */
import { ConnectionException } from '@mikro-orm/core';

/** Socket-level codes of a refused, cut or unreachable connection. */
const NETWORK_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ECONNABORTED', 'EPIPE', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENETUNREACH', 'ENOTFOUND', 'EAI_AGAIN']);
/** SQLSTATE 57P01 admin_shutdown, 57P02 crash_shutdown, 57P03 cannot_connect_now (PostgreSQL, Appendix A). */
const SHUTDOWN_STATES = new Set(['57P01', '57P02', '57P03']);
/** Messages of pg (lost connection) and knex/tarn (no connection could be acquired). */
const LOST_CONNECTION = /Connection terminated|connection error|Connection ended|Client was closed|not queryable|Timeout acquiring a connection|terminating connection due to administrator command/i;

export function isDatabaseUnavailable(err: unknown, depth = 0): boolean {
  if (!err || typeof err !== 'object' || depth > 4) return false;
  if (err instanceof ConnectionException) return true;
  const { code, message, cause, previous } = err as { code?: unknown; message?: unknown; cause?: unknown; previous?: unknown };
  if (typeof code === 'string' && (NETWORK_CODES.has(code) || SHUTDOWN_STATES.has(code) || /^08[0-9A-Z]{3}$/.test(code))) return true;
  if (typeof message === 'string' && LOST_CONNECTION.test(message)) return true;
  // AggregateError (several addresses refused), MikroORM's wrapped driver error, `cause` chains.
  const inner = (err as { errors?: unknown }).errors;
  if (Array.isArray(inner) && inner.some((e) => isDatabaseUnavailable(e, depth + 1))) return true;
  return isDatabaseUnavailable(cause, depth + 1) || isDatabaseUnavailable(previous, depth + 1);
}
