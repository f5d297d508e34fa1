/** When a list's first page already holds every match, its length is the total (our own rule). */
import { describe, expect, it } from 'vitest';
import { wholeListOnFirstPage } from '@server/db/bounded-total';

describe('wholeListOnFirstPage', () => {
  it('takes a short first page as the whole list', () => {
    expect(wholeListOnFirstPage(0, 3, 25)).toEqual({ total: 3, exact: true });
    expect(wholeListOnFirstPage(0, 0, 25)).toEqual({ total: 0, exact: true });
  });

  it('asks for a count when the page is full, or is not the first', () => {
    expect(wholeListOnFirstPage(0, 25, 25)).toBeNull();
    expect(wholeListOnFirstPage(25, 3, 25)).toBeNull();
  });

  it('trusts the extra row a query fetched beyond the page', () => {
    expect(wholeListOnFirstPage(0, 25, 25, false)).toEqual({ total: 25, exact: true });
    expect(wholeListOnFirstPage(0, 25, 25, true)).toBeNull();
  });
});
