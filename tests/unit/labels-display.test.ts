import { describe, expect, it } from 'vitest';
import { CORRECTION_STANDARDS } from '@shared/analysis/correction';
import { CORRECTION_IDS } from '@shared/schemas/run';
import { correctionLabel, correctionOptions } from '@shared/labels-display';

describe('correction standard labels (src/shared/labels-display.ts)', () => {
  it('names each standard as the engine lists it', () => {
    expect(correctionLabel('sae-j1349')).toBe('SAE J1349');
    expect(correctionLabel('sae-j1349-1990')).toBe('SAE J1349 (1990)');
    expect(correctionLabel('iso-1585')).toBe('ISO 1585');
    expect(correctionLabel('din-70020')).toBe('DIN 70020');
  });

  it('words "none" as the caller asks, and otherwise as the engine does', () => {
    expect(correctionLabel('none')).toBe('Uncorrected');
    expect(correctionLabel('none', 'uncorrected')).toBe('uncorrected');
    // the wording for none never replaces a real standard's label
    expect(correctionLabel('iso-1585', 'uncorrected')).toBe('ISO 1585');
  });

  it('shows an id the engine does not know as it is', () => {
    expect(correctionLabel('old-standard')).toBe('old-standard');
  });

  it('gives one option per API correction id, in the API order', () => {
    const options = correctionOptions(CORRECTION_IDS);
    expect(options.map((o) => o.value)).toEqual([...CORRECTION_IDS]);
    expect(options.map((o) => o.label)).toEqual(CORRECTION_IDS.map((id) => CORRECTION_STANDARDS.find((s) => s.id === id)?.label));
  });
});
