import { describe, expect, it } from 'vitest';
import { QueryClient } from '@tanstack/react-query';
import * as keys from '@/lib/query-keys';
import { shopQuery } from '@/lib/shop-query';

/** Each factory and the resource root its keys must start with. */
const ROOTS: [keyof typeof keys, string][] = [
  ['runKeys', 'runs'],
  ['sessionKeys', 'sessions'],
  ['stageKeys', 'stages'],
  ['bikeKeys', 'bikes'],
  ['customerKeys', 'customers'],
  ['comparisonKeys', 'comparisons'],
  ['reportKeys', 'reports'],
  ['buildKeys', 'builds'],
  ['shopKeys', 'shop'],
  ['authKeys', 'auth'],
];

describe('query keys rooted by resource (src/lib/query-keys.ts)', () => {
  it('every key of a factory starts with its resource', () => {
    for (const [name, root] of ROOTS) {
      const factory = keys[name] as Record<string, (...args: string[]) => readonly unknown[]>;
      for (const [member, make] of Object.entries(factory)) {
        expect({ key: `${name}.${member}`, root: make('x', 'y', 'z')[0] }).toEqual({ key: `${name}.${member}`, root });
      }
    }
  });

  it('invalidating a resource reaches its lists, details and derived views, and nothing else', async () => {
    const qc = new QueryClient({ defaultOptions: { queries: { retry: false, staleTime: Infinity } } });
    qc.setQueryData(keys.comparisonKeys.candidates('b1'), []);
    qc.setQueryData(keys.comparisonKeys.timeline('b1'), {});
    qc.setQueryData(keys.comparisonKeys.detail('c1'), {});
    qc.setQueryData(keys.bikeKeys.detail('b1'), {});
    await qc.invalidateQueries({ queryKey: keys.comparisonKeys.candidatesAll() });
    expect(qc.getQueryState(keys.comparisonKeys.candidates('b1'))?.isInvalidated).toBe(true);
    expect(qc.getQueryState(keys.comparisonKeys.timeline('b1'))?.isInvalidated).toBe(false);
    await qc.invalidateQueries({ queryKey: keys.comparisonKeys.all() });
    expect(qc.getQueryState(keys.comparisonKeys.timeline('b1'))?.isInvalidated).toBe(true);
    expect(qc.getQueryState(keys.comparisonKeys.detail('c1'))?.isInvalidated).toBe(true);
    expect(qc.getQueryState(keys.bikeKeys.detail('b1'))?.isInvalidated).toBe(false);
  });

  it('the shop has one entry, ["shop"]', () => {
    expect(shopQuery().queryKey).toEqual(['shop']);
  });
});
