/**
 * The session's latest upload batch, worked out from the runs themselves (each file of a batch
 * becomes a run, read or not): the newest run and every run created before it with no pause
 * longer than `gapMs` between one and the next. A tuner's drop of 40 files takes seconds to
 * minutes between consecutive files; the next batch of the visit comes after the next set of
 * pulls, many minutes later. Pulls of one log share its creation time and stay together.
 */
export const BATCH_GAP_MS = 5 * 60_000;

export function latestBatch<T extends { createdAt: string; deletedAt?: string | null }>(runs: readonly T[], gapMs = BATCH_GAP_MS): T[] {
  const live = runs.filter((r) => !r.deletedAt).map((r) => ({ r, t: Date.parse(r.createdAt) }));
  live.sort((a, b) => b.t - a.t);
  if (!live.length) return [];
  const batch = [live[0]];
  for (let i = 1; i < live.length; i++) {
    if (batch[batch.length - 1].t - live[i].t > gapMs) break;
    batch.push(live[i]);
  }
  // Oldest first: the order the files were dropped in.
  return batch.reverse().map((x) => x.r);
}
