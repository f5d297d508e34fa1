/** Names the engine prints: bikes, runs and correction standards. */
import { CORRECTION_STANDARDS } from '@shared/analysis/correction';

export const bikeLabel = (b: { year: number | null; make: string; model: string }) => [b.year, b.make, b.model].filter((v) => v !== null && v !== undefined && v !== '').join(' ');
export const runName = (r: { label: string | null; sequence: number; stage: { name: string } | null }) => r.label || `${r.stage?.name ?? 'Unstaged'} · run ${r.sequence}`;
export const standardLabel = (s: string) => CORRECTION_STANDARDS.find((c) => c.id === s)?.label ?? s;
export const r4 = (v: number) => Math.round(v * 1e4) / 1e4;
export const r3 = (v: number) => Math.round(v * 1e3) / 1e3;
