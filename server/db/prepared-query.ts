import { createHash } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/postgresql';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A SQL text with `$1…$n` placeholders, named for PostgreSQL's per-connection statement cache. */
export interface PreparedStatement {
  name: string;
  text: string;
}

/**
 * Names a statement after its text, converting knex-style `?` placeholders to `$1…$n` in order.
 * Use it only for a bounded family of texts (each name stays prepared on every pooled
 * connection for the connection's life).
 */
export function preparedStatement(textWithQuestionMarks: string): PreparedStatement {
  let n = 0;
  const text = textWithQuestionMarks.replace(/\?/g, () => `$${++n}`);
  return { name: `pb_${createHash('sha1').update(text).digest('hex').slice(0, 24)}`, text };
}

let namedStatements = true;

/**
 * Turns statement names on or off for the whole process (DATABASE_NAMED_STATEMENTS). Off is for
 * a connection pooler in transaction mode that cannot keep prepared statements (e.g. PgBouncer
 * without max_prepared_statements): the same texts are then sent unnamed.
 */
export function useNamedStatements(enabled: boolean) {
  namedStatements = enabled;
}

/** The pg query config for a statement: named unless names are turned off. */
export function asQuery(statement: PreparedStatement, values: unknown[]): { name?: string; text: string; values: unknown[] } {
  return namedStatements ? { name: statement.name, text: statement.text, values } : { text: statement.text, values };
}

interface PgConnection {
  query(q: { name?: string; text: string; values: unknown[] }): Promise<{ rows: unknown[] }>;
}

/**
 * Runs a named statement on one of the ORM's pooled connections: PostgreSQL parses and plans
 * it once per connection instead of on every request. Inside a transaction the transaction's
 * own connection is used, unnamed, so the caller's uncommitted rows are seen — pass the
 * transaction's EntityManager (`tx` in `em.transactional(tx => …)`), not the request's, or the
 * read takes a second pooled connection and cannot see the transaction's rows.
 */
export async function preparedQuery<T>(em: EntityManager, statement: PreparedStatement, values: unknown[]): Promise<T[]> {
  if (em.isInTransaction()) {
    const bindings: unknown[] = [];
    const text = statement.text.replace(/\$(\d+)/g, (_m, n: string) => {
      const v = values[Number(n) - 1];
      // knex would spread an array into a list; PostgreSQL reads this literal, which needs no
      // quoting for uuids and numbers (the only arrays passed here; anything else is refused).
      if (Array.isArray(v) && !v.every((x) => typeof x === 'number' || (typeof x === 'string' && UUID.test(x)))) {
        throw new Error('preparedQuery: inside a transaction only arrays of uuids or numbers can be bound');
      }
      bindings.push(Array.isArray(v) ? `{${v.join(',')}}` : v);
      return '?';
    });
    return em.getConnection().execute<T[]>(text, bindings, 'all', em.getTransactionContext());
  }
  const client = em.getKnex().client;
  const connection = (await client.acquireConnection()) as PgConnection;
  try {
    return (await connection.query(asQuery(statement, values))).rows as T[];
  } finally {
    await client.releaseConnection(connection);
  }
}
