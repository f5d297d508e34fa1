/**
 * What a gain cost, by stage — the one rule used by the stage timeline (bike page) and the gain
 * report, so both print the same cost per horsepower.
 *
 * A gain measured from stage A to stage B was bought by every stage after A up to and including B,
 * in build order (position, then creation) — also the stages in between that had no run in the
 * comparison. A stage's cost is the sum of its parts (part + labour); a stage without parts falls
 * back to the stage's own recorded total.
 */

export interface CostedStage {
  id: string;
  name: string;
  costCents: number;
}

/** A stage's cost: its parts' part + labour costs, or the stage's own total when it has no parts. */
export function stageCostCents(stage: { totalCostCents: number }, parts: { partCostCents: number; labourCostCents: number }[]): number {
  return parts.length ? parts.reduce((s, p) => s + p.partCostCents + p.labourCostCents, 0) : stage.totalCostCents;
}

/**
 * The stages that paid for a gain from `fromStageId` to `toStageId` (exclusive … inclusive) and
 * their total. `stages` are the bike's stages in build order. Null when either stage is unknown or
 * `to` is not after `from`.
 */
export function costBetweenStages(stages: CostedStage[], fromStageId: string | null, toStageId: string | null): { totalCents: number; stages: CostedStage[] } | null {
  if (!fromStageId || !toStageId) return null;
  const from = stages.findIndex((s) => s.id === fromStageId);
  const to = stages.findIndex((s) => s.id === toStageId);
  if (from < 0 || to < 0 || to <= from) return null;
  const covered = stages.slice(from + 1, to + 1);
  return { totalCents: covered.reduce((s, x) => s + x.costCents, 0), stages: covered };
}
