import { CORRECTION_IDS } from '@shared/schemas/run';
import { correctionOptions } from '@shared/labels-display';

/** The correction standards as select options, in the API's order. */
export const CORRECTION_OPTIONS = correctionOptions(CORRECTION_IDS);

/** Shown under every correction-standard picker. */
export const CORRECTION_HINT = 'Motorcycle engine test practice is covered by ISO 4106; shops choose the standard their customers expect.';
