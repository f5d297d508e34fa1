import { describe, expect, it } from 'vitest';
import { formatPageTitle, PRODUCT_NAME } from '@/lib/page-title';

// The title pattern is the product's own convention (page name, a middle dot, then whose it is);
// no published source.
describe('formatPageTitle', () => {
  it('puts the page name before the shop', () => {
    expect(formatPageTitle('Runs', 'Kestrel Ridge Motorworks')).toBe('Runs · Kestrel Ridge Motorworks');
  });

  it('falls back to the product name while the shop is unknown or blank', () => {
    expect(formatPageTitle('Sign in', null)).toBe(`Sign in · ${PRODUCT_NAME}`);
    expect(formatPageTitle('Gain report', undefined)).toBe('Gain report · Pullbook');
    expect(formatPageTitle('Runs', '   ')).toBe('Runs · Pullbook');
  });

  it('is only the shop (or product) name when the page has no name yet', () => {
    expect(formatPageTitle(null, 'Kestrel Ridge Motorworks')).toBe('Kestrel Ridge Motorworks');
    expect(formatPageTitle('  ', null)).toBe('Pullbook');
  });

  it('trims stray spaces around both parts', () => {
    expect(formatPageTitle(' Bikes ', ' Kestrel Ridge Motorworks ')).toBe('Bikes · Kestrel Ridge Motorworks');
  });
});
