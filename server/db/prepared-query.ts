import { createHash } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/postgresql';

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

interface PgConnection {
  query(q: { name: string; text: string; values: unknown[] }): Promise<{ rows: unknown[] }>;
}

/**
 * Runs a named statement on one of the ORM's pooled connections: PostgreSQL parses and plans
 * it once per connection instead of on every request. Inside a transaction the transaction's
 * own connection is used, unnamed, so the caller's uncommitted rows are seen.
 */
export async function preparedQuery<T>(em: EntityManager, statement: PreparedStatement, values: unknown[]): Promise<T[]> {
  if (em.isInTransaction()) {
    const bindings: unknown[] = [];
    const text = statement.text.replace(/\$(\d+)/g, (_m, n: string) => {
      const v = values[Number(n) - 1];
      // knex would spread an array into a list; PostgreSQL reads this literal (fine for uuids,
      // numbers and booleans, the only arrays passed here).
      bindings.push(Array.isArray(v) ? `{${v.join(',')}}` : v);
      return '?';
    });
    return em.getConnection().execute<T[]>(text, bindings, 'all', em.getTransactionContext());
  }
  const client = em.getKnex().client;
  const connection = (await client.acquireConnection()) as PgConnection;
  try {
    return (await connection.query({ ...statement, values })).rows as T[];
  } finally {
    await client.releaseConnection(connection);
  }
}
