import { describe, expect, it } from 'vitest';
import { BATCH_GAP_MS, latestBatch } from '@/features/runs/lib/latest-batch';

const at = (id: string, iso: string, deletedAt: string | null = null) => ({ id, createdAt: iso, deletedAt });

// The batch rule is the product's own (common practice, no published source): files of one drop
// land seconds apart; the next drop of a visit follows the next set of pulls, minutes later.
describe('latestBatch', () => {
  it('takes the newest run and those before it with no pause longer than the gap, oldest first', () => {
    const runs = [
      at('a', '2026-12-02T09:00:00Z'),
      at('b', '2026-12-02T09:00:20Z'),
      at('c', '2026-12-02T10:00:00Z'),
      at('d', '2026-12-02T10:00:05Z'),
      at('e', '2026-12-02T10:04:59Z'),
    ];
    expect(latestBatch(runs).map((r) => r.id)).toEqual(['c', 'd', 'e']);
  });

  it('ends the batch at a pause just over the gap and keeps one exactly at it', () => {
    const t0 = Date.parse('2026-12-02T10:00:00Z');
    const iso = (ms: number) => new Date(t0 + ms).toISOString();
    expect(latestBatch([at('a', iso(0)), at('b', iso(BATCH_GAP_MS))]).map((r) => r.id)).toEqual(['a', 'b']);
    expect(latestBatch([at('a', iso(0)), at('b', iso(BATCH_GAP_MS + 1))]).map((r) => r.id)).toEqual(['b']);
  });

  it('ignores deleted runs and answers nothing for no runs', () => {
    expect(latestBatch([])).toEqual([]);
    expect(latestBatch([at('a', '2026-12-02T09:00:00Z'), at('b', '2026-12-02T11:00:00Z', '2026-12-02T11:01:00Z')]).map((r) => r.id)).toEqual(['a']);
  });

  it('keeps the pulls of one log (same creation time) together, whatever order they come in', () => {
    const runs = [at('p2', '2026-12-02T10:00:00Z'), at('x', '2026-12-02T08:00:00Z'), at('p1', '2026-12-02T10:00:00Z')];
    expect(latestBatch(runs).map((r) => r.id).sort()).toEqual(['p1', 'p2']);
  });
});
