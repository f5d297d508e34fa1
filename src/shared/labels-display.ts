/**
 * Labels of engine and schema identifiers as screens show them, each written once. Pure TS, no DOM.
 * (The bike label lives in src/shared/labels.ts.)
 */
import { CORRECTION_STANDARDS, type CorrectionStandard } from './analysis/correction';

/**
 * A correction standard's label from the engine's CORRECTION_STANDARDS ("SAE J1349", "ISO 1585"…).
 * `none` reads "Uncorrected" unless the caller words it (e.g. "uncorrected" mid-sentence). An id
 * the engine does not know (an old stored value) is shown as it is.
 */
export function correctionLabel(id: CorrectionStandard | string, none?: string): string {
  if (id === 'none' && none !== undefined) return none;
  return CORRECTION_STANDARDS.find((s) => s.id === id)?.label ?? id;
}

/** Select options for a list of correction ids, labelled from the engine. */
export function correctionOptions(ids: readonly CorrectionStandard[]): { value: CorrectionStandard; label: string }[] {
  return ids.map((id) => ({ value: id, label: correctionLabel(id) }));
}
