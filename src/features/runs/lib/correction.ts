import { CORRECTION_IDS } from '@shared/schemas/run';
import { CORRECTION_STANDARDS } from '@shared/analysis/correction';

/** The correction standards as select options, in the API's order. */
export const CORRECTION_OPTIONS = CORRECTION_IDS.map((id) => ({ value: id, label: CORRECTION_STANDARDS.find((s) => s.id === id)?.label ?? id }));

/** Shown under every correction-standard picker. */
export const CORRECTION_HINT = 'Motorcycle engine test practice is covered by ISO 4106; shops choose the standard their customers expect.';
