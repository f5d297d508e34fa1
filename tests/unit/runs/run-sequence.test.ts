import { describe, expect, it } from 'vitest';
import { sequenceAfter, sequenceScope } from '@server/modules/runs/run-sequence';

const BIKE = '11111111-1111-4111-8111-111111111111';
const OTHER_BIKE = '22222222-2222-4222-8222-222222222222';
const SESSION = '33333333-3333-4333-8333-333333333333';

// Numbering rules are the product's own (common practice, no published source).
describe('run sequence numbers', () => {
  it('starts at 1 and follows the highest number taken', () => {
    expect(sequenceAfter(null)).toBe(1);
    expect(sequenceAfter(undefined)).toBe(1);
    expect(sequenceAfter(0)).toBe(1);
    expect(sequenceAfter(7)).toBe(8);
    // PostgreSQL drivers may answer an aggregate as text.
    expect(sequenceAfter('12')).toBe(13);
  });

  it('refuses something that is not a sequence number', () => {
    expect(() => sequenceAfter('x')).toThrow(/Not a run sequence number/);
    expect(() => sequenceAfter(-1)).toThrow();
    expect(() => sequenceAfter(2.5)).toThrow();
  });

  it('counts within the session when there is one, else within the bike’s runs without a session', () => {
    const inSession = sequenceScope(BIKE, SESSION);
    expect(inSession.params).toEqual([BIKE, SESSION]);
    expect(inSession.sql).toMatch(/where bike_id = \? and session_id = \?$/);
    const noSession = sequenceScope(BIKE, null);
    expect(noSession.params).toEqual([BIKE]);
    expect(noSession.sql).toMatch(/where bike_id = \? and session_id is null$/);
  });

  it('takes one lock per bike, shared by its sessions, so concurrent uploads to a bike queue up', () => {
    expect(sequenceScope(BIKE, SESSION).lockKey).toBe(sequenceScope(BIKE, null).lockKey);
    expect(sequenceScope(BIKE, null).lockKey).not.toBe(sequenceScope(OTHER_BIKE, null).lockKey);
  });
});
