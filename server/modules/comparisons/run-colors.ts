/**
 * Which colour a run gets, the same in every view (builder preview, saved comparison, share page,
 * PDF): its place in its bike's archive, not its place in one comparison.
 *
 * Rule: a bike's runs in build order — stage position (runs without a stage last), then the run's
 * sequence within the stage, then when it was uploaded, then id — are numbered 0, 1, 2, …; the run's
 * colour slot is that number modulo the palette size. So "Stage 3 · run 1" has the same colour
 * whether it is compared with one run or with three. If two runs of one comparison land on the same
 * slot (more than a palette's worth of runs apart, or runs of different bikes), the later one in
 * archive order takes the next free slot, so a chart never shows two runs in one colour while
 * colours are left.
 */

/** Colours in the run palette (src/shared/run-style.ts RUN_PALETTE: the eight Okabe–Ito colours). */
export const RUN_COLOR_SLOTS = 8;

export interface ArchiveRun {
  id: string;
  bikeId: string;
  stagePosition: number | null;
  sequence: number;
  createdAt: string | Date;
}

function archiveOrder(a: ArchiveRun, b: ArchiveRun): number {
  const pa = a.stagePosition ?? Number.POSITIVE_INFINITY;
  const pb = b.stagePosition ?? Number.POSITIVE_INFINITY;
  if (pa !== pb) return pa < pb ? -1 : 1;
  if (a.sequence !== b.sequence) return a.sequence - b.sequence;
  const ta = new Date(a.createdAt).getTime();
  const tb = new Date(b.createdAt).getTime();
  if (ta !== tb) return ta - tb;
  return a.id < b.id ? -1 : a.id > b.id ? 1 : 0;
}

/**
 * Colour slots for `runIds`, given every run of their bikes (`archive`). Runs missing from the
 * archive are numbered after it, in the order given.
 */
export function runColorSlots(archive: ArchiveRun[], runIds: string[], slots = RUN_COLOR_SLOTS): Map<string, number> {
  const rank = new Map<string, number>();
  const byBike = new Map<string, ArchiveRun[]>();
  for (const r of archive) byBike.set(r.bikeId, [...(byBike.get(r.bikeId) ?? []), r]);
  for (const runs of byBike.values()) [...runs].sort(archiveOrder).forEach((r, i) => rank.set(r.id, i));
  let extra = archive.length;
  for (const id of runIds) if (!rank.has(id)) rank.set(id, extra++);
  const order = [...new Set(runIds)].sort((a, b) => rank.get(a)! - rank.get(b)! || (a < b ? -1 : 1));
  const used = new Set<number>();
  const out = new Map<string, number>();
  for (const id of order) {
    let slot = rank.get(id)! % slots;
    if (used.size < slots) while (used.has(slot)) slot = (slot + 1) % slots;
    used.add(slot);
    out.set(id, slot);
  }
  return out;
}
