/**
 * A run's number: the order of its pull within its session (1, 2, 3…), or, for runs uploaded
 * without a session, within that bike's session-less runs. Numbers are never reused after a
 * delete (soft-deleted runs keep theirs) and are taken under a per-bike lock, so two uploads
 * at the same moment cannot draw the same number.
 */
import type { EntityManager } from '@mikro-orm/postgresql';

export interface SequenceScope {
  /** Key of the transaction-scoped advisory lock: one per bike, sessions and no session alike. */
  lockKey: string;
  /** SQL answering the highest number taken in the scope as `max` (null when none) for `params`. */
  sql: string;
  params: string[];
}

/** Where a new run of this bike (and session, if any) counts from. */
export function sequenceScope(bikeId: string, sessionId: string | null): SequenceScope {
  return sessionId
    ? // A session's runs are all of one bike: bike_id first, so run's bike index serves it (no index leads with session_id).
      { lockKey: `run-seq:${bikeId}`, sql: 'select max(sequence) as max from run where bike_id = ? and session_id = ?', params: [bikeId, sessionId] }
    : { lockKey: `run-seq:${bikeId}`, sql: 'select max(sequence) as max from run where bike_id = ? and session_id is null', params: [bikeId] };
}

/** The number after the highest one taken; 1 for the first run. PostgreSQL may answer the maximum as text. */
export function sequenceAfter(max: number | string | null | undefined): number {
  const highest = max === null || max === undefined ? 0 : Number(max);
  if (!Number.isInteger(highest) || highest < 0) throw new Error(`Not a run sequence number: ${String(max)}`);
  return highest + 1;
}

/** The next number, inside the caller's transaction (the lock is released when it ends). */
export async function nextSequence(em: EntityManager, bikeId: string, sessionId: string | null): Promise<number> {
  const scope = sequenceScope(bikeId, sessionId);
  const conn = em.getConnection();
  await conn.execute('select pg_advisory_xact_lock(hashtextextended(?, 0))', [scope.lockKey], 'all', em.getTransactionContext());
  const rows = (await conn.execute(scope.sql, scope.params, 'all', em.getTransactionContext())) as { max: number | string | null }[];
  return sequenceAfter(rows[0]?.max);
}
