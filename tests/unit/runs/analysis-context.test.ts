import { describe, expect, it } from 'vitest';
import { analysisContext } from '@server/modules/runs/run-analysis';
import type { DynoSession } from '@server/modules/sessions/dyno-session.entity';
import type { Shop } from '@server/modules/shops/shop.entity';

// Plain stand-ins for the two entities: analysisContext reads only these fields.
const session = (over: Partial<DynoSession> = {}) => ({ correctionStandard: 'iso-1585', ambientTempC: null, baroKpa: null, humidityPct: null, ...over }) as DynoSession;
const shop = (defaultCorrection: string) => ({ defaultCorrection }) as Shop;

// Which standard applies is the product's rule (common practice, no published source); the
// standards' names are those of SAE J1349, ISO 1585 and DIN 70020.
describe('analysisContext', () => {
  it('uses the session’s standard before the shop’s default, and SAE J1349 when neither is known', () => {
    expect(analysisContext(session(), shop('din-70020')).correction).toBe('iso-1585');
    expect(analysisContext(null, shop('din-70020')).correction).toBe('din-70020');
    expect(analysisContext(null, null).correction).toBe('sae-j1349');
  });

  it('falls back to SAE J1349 for a standard the engine does not know', () => {
    expect(analysisContext(session({ correctionStandard: 'house-rule' }), null).correction).toBe('sae-j1349');
  });

  it('passes on only the conditions the session recorded, zero included', () => {
    expect(analysisContext(session({ ambientTempC: 0, baroKpa: 101.325 }), null).conditions).toEqual({ temperatureC: 0, baroKpa: 101.325 });
    expect(analysisContext(session({ humidityPct: 40 }), null).conditions).toEqual({ humidityPct: 40 });
    expect(analysisContext(null, null).conditions).toEqual({});
  });
});
