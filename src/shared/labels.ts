/**
 * Display labels written once for server, PDF and client. A bike reads "2019 Make Model": the
 * year when known, then make and model, skipping whatever is blank. A run reads its own label, or
 * "Stage 1 · pull 4" (its stage and its pull number in the session), with the uploaded file's name
 * as secondary text ("pull-04.csv", or "log.csv · pull 2 of 3" for a log that held several pulls),
 * so a pull on any screen, in the PDF or in a CSV export can be matched to its file.
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

/** What a run's name is made of; the stage as an object (engine rows) or as its name (DTOs). */
export interface RunNameParts {
  label?: string | null;
  sequence: number;
  stage?: { name: string } | null;
  stageName?: string | null;
}

/** What a run without a stage is filed under. */
export const NO_STAGE = 'No stage';

/**
 * A run's name: the label a person gave it, else "<stage> · pull <n>" with n its pull number in
 * its session ("No stage · pull 3" before it is tagged).
 */
export function runName(r: RunNameParts): string {
  const label = r.label?.trim();
  if (label) return label;
  const stage = r.stage?.name ?? r.stageName ?? NO_STAGE;
  return `${stage} · pull ${r.sequence}`;
}

/** What a run's secondary text is made of. */
export interface RunFileParts {
  originalName: string;
  /** 0-based pull within the file, and how many pulls it held (1 for a plain run file). */
  pullIndex?: number | null;
  pullCount?: number | null;
}

/** A run's secondary text: its file, and which pull of the file when it held several. */
export function runFileLabel(r: RunFileParts): string {
  const count = r.pullCount ?? 1;
  if (count < 2) return r.originalName;
  return `${r.originalName} · pull ${(r.pullIndex ?? 0) + 1} of ${count}`;
}

/** Name and file in one line ("Stage 1 · pull 4 (pull-04.csv)"), for plain text such as CSV cells and messages. */
export function runNameWithFile(r: RunNameParts & RunFileParts): string {
  return `${runName(r)} (${runFileLabel(r)})`;
}

/**
 * A name for the next stage of a build: "Baseline" for the first, then "Stage 1", "Stage 2"…
 * after the highest "Stage n" taken (common practice, no published source: shops number their
 * stages after the stock baseline).
 */
export function nextStageName(existing: readonly string[]): string {
  if (!existing.length) return 'Baseline';
  let highest = 0;
  for (const name of existing) {
    const m = /^stage\s+(\d+)\b/i.exec(name.trim());
    if (m) highest = Math.max(highest, Number(m[1]));
  }
  const taken = new Set(existing.map((n) => n.trim().toLowerCase()));
  let n = highest + 1;
  while (taken.has(`stage ${n}`)) n += 1;
  return `Stage ${n}`;
}
