import type { QueryClient, QueryKey } from '@tanstack/react-query';

/** Marks every query under each key stale and refetches the ones on screen. */
export function invalidateKeys(qc: QueryClient, keys: readonly QueryKey[]): Promise<unknown> {
  return Promise.all(keys.map((queryKey) => qc.invalidateQueries({ queryKey })));
}
