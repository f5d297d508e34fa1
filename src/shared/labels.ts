/**
 * Display labels written once for server, PDF and client. A bike reads "2019 Make Model": the
 * year when known, then make and model, skipping whatever is blank. A run reads its own label, or
 * "Stage 1 · run 4" (its stage and its number within it).
 */
export interface BikeLabelParts {
  year: number | null | undefined;
  make: string | null | undefined;
  model: string | null | undefined;
}

/** "2019 Make Model"; an unknown year or a blank make or model is left out. */
export function bikeLabel({ year, make, model }: BikeLabelParts): string {
  return [year, make, model].filter((part) => part !== null && part !== undefined && part !== '').join(' ');
}

/** A run's name: its label when it has one, else "<stage> · run <n>" ("Unstaged" without a stage). */
export function runName(r: { label: string | null; sequence: number; stage: { name: string } | null }): string {
  return r.label || `${r.stage?.name ?? 'Unstaged'} · run ${r.sequence}`;
}
