import { describe, expect, it } from 'vitest';
import { ConnectionException, DriverException } from '@mikro-orm/core';
import { isDatabaseUnavailable } from '@server/lib/db-errors';

const withCode = (code: string, message = 'x') => Object.assign(new Error(message), { code });

describe('isDatabaseUnavailable', () => {
  // Socket codes: Node.js docs, "Common system errors" (errors.md).
  it('recognises refused and cut connections', () => {
    expect(isDatabaseUnavailable(withCode('ECONNREFUSED', 'connect ECONNREFUSED 127.0.0.1:5432'))).toBe(true);
    expect(isDatabaseUnavailable(withCode('ECONNRESET'))).toBe(true);
  });

  // SQLSTATE classes: PostgreSQL documentation, Appendix A "PostgreSQL Error Codes"
  // (57P01 admin_shutdown, 57P03 cannot_connect_now, class 08 connection exception).
  it('recognises server shutdown, start-up and connection-exception states', () => {
    expect(isDatabaseUnavailable(withCode('57P01', 'terminating connection due to administrator command'))).toBe(true);
    expect(isDatabaseUnavailable(withCode('57P03', 'the database system is starting up'))).toBe(true);
    expect(isDatabaseUnavailable(withCode('08006'))).toBe(true);
    expect(isDatabaseUnavailable(withCode('08P01'))).toBe(true);
  });

  it('recognises pg and knex lost-connection messages and wrapped errors', () => {
    expect(isDatabaseUnavailable(new Error('Connection terminated unexpectedly'))).toBe(true);
    expect(isDatabaseUnavailable(new Error('Knex: Timeout acquiring a connection. The pool is probably full.'))).toBe(true);
    expect(isDatabaseUnavailable(new ConnectionException(new Error('boom')))).toBe(true);
    expect(isDatabaseUnavailable(new Error('query failed', { cause: withCode('ECONNREFUSED') }))).toBe(true);
    expect(isDatabaseUnavailable(new AggregateError([withCode('ECONNREFUSED')], 'all addresses failed'))).toBe(true);
  });

  it('leaves ordinary query and application errors alone', () => {
    // 23505 unique_violation, 42P01 undefined_table (same Appendix A).
    expect(isDatabaseUnavailable(withCode('23505', 'duplicate key value violates unique constraint'))).toBe(false);
    expect(isDatabaseUnavailable(new DriverException(withCode('42P01', 'relation "x" does not exist')))).toBe(false);
    expect(isDatabaseUnavailable(new Error('something else'))).toBe(false);
    expect(isDatabaseUnavailable(undefined)).toBe(false);
    expect(isDatabaseUnavailable('ECONNREFUSED')).toBe(false);
  });
});
