/**
 * Object writes journaled in PostgreSQL before they happen. A process killed between storing an
 * object and committing the row that points to it leaves an `object_write` entry behind; the
 * reconciliation (modules/runs/orphan-reconcile.ts) removes such an object once the write is older
 * than ORPHAN_GRACE_SECONDS and no row points to it. Only keys whose owning rows the
 * reconciliation knows are journaled, so an object of any other kind is never removed by it.
 */
import type { Orm } from '../../db/orm';
import type { ObjectStore } from './object-store';

/** Raw run files, report PDFs and shop logos (raw-store.ts, create-report.ts, shop-logo.ts). */
export const RECONCILED_KEY = /^shops\/[0-9a-f-]{36}\/(?:bikes\/[0-9a-f-]{36}\/[0-9a-f]{64}|reports\/[^/]+\/v\d+\.pdf|logo\/[^/]+\.(?:png|jpg))$/;

export function journalWrites(store: ObjectStore, orm: Orm): ObjectStore {
  return {
    ...store,
    // Methods that call each other through `this` keep the original object as `this`.
    getBuffer: (key) => store.getBuffer(key),
    async put(key, body, opts) {
      if (RECONCILED_KEY.test(key)) {
        await orm.em
          .fork()
          .getConnection()
          .execute(`insert into object_write (key, started_at) values (?, now()) on conflict (key) do update set started_at = now()`, [key]);
      }
      await store.put(key, body, opts);
    },
  };
}
