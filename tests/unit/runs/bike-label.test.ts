import { describe, expect, it } from 'vitest';
import { bikeLabel } from '@shared/labels';

// Label conventions are the product's own (common practice, no published source).
describe('bikeLabel', () => {
  it('reads year, make and model in that order', () => {
    expect(bikeLabel({ year: 2019, make: 'Ridgeback', model: 'Tourer 114' })).toBe('2019 Ridgeback Tourer 114');
  });

  it('leaves out an unknown year and blank parts without doubling spaces', () => {
    expect(bikeLabel({ year: null, make: 'Ridgeback', model: 'Tourer 114' })).toBe('Ridgeback Tourer 114');
    expect(bikeLabel({ year: 2003, make: 'Ridgeback', model: '' })).toBe('2003 Ridgeback');
    expect(bikeLabel({ year: undefined, make: null, model: 'Special' })).toBe('Special');
    expect(bikeLabel({ year: null, make: '', model: '' })).toBe('');
  });
});
