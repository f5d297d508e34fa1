import { describe, expect, it } from 'vitest';
import { correctionHeadline } from '@server/modules/reports/figures';

const run = (correctionStandard: string, correctionLabel: string) => ({ correctionStandard, correctionLabel });

describe('correctionHeadline', () => {
  it('says "as measured" when no run was corrected', () => {
    expect(correctionHeadline([run('none', 'Uncorrected'), run('none', 'Uncorrected')])).toBe('Uncorrected (as measured)');
    expect(correctionHeadline([])).toBe('Uncorrected (as measured)');
  });

  it('names the one standard when every run used it', () => {
    expect(correctionHeadline([run('sae-j1349', 'SAE J1349'), run('sae-j1349', 'SAE J1349')])).toBe('Corrected to SAE J1349');
  });

  it('lists each standard once when the runs carry their own corrections', () => {
    expect(correctionHeadline([run('sae-j1349', 'SAE J1349'), run('din-70020', 'DIN 70020'), run('sae-j1349', 'SAE J1349')])).toBe('Each run corrected to its own standard: SAE J1349, DIN 70020');
    expect(correctionHeadline([run('none', 'Uncorrected'), run('sae-j1349', 'SAE J1349')])).toBe('Each run corrected to its own standard: uncorrected (as measured), SAE J1349');
  });
});
