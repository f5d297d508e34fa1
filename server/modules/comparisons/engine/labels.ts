/** Names the engine prints: bikes, runs and correction standards (each defined once in src/shared). */
export { bikeLabel, runName } from '@shared/labels';
import { correctionLabel } from '@shared/labels-display';

/** A standard's label by id (one argument, so it can be passed to `map`). */
export const standardLabel = (id: string) => correctionLabel(id);
export const r4 = (v: number) => Math.round(v * 1e4) / 1e4;
export const r3 = (v: number) => Math.round(v * 1e3) / 1e3;
