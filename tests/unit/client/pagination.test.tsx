/**
 * The pagination bar under a list whose total is the database's estimate (a large archive, see
 * server/db/bounded-total.ts): it says "about" and offers no jump to a last page it cannot know.
 */
import { describe, expect, it } from 'vitest';
import { renderToStaticMarkup } from 'react-dom/server';
import { Pagination } from '@/components/ui/Pagination';

const render = (totalIsEstimate: boolean) =>
  renderToStaticMarkup(<Pagination pageIndex={2} pageCount={992} onPageChange={() => undefined} pageSize={25} totalRows={24_800} totalIsEstimate={totalIsEstimate} />);

describe('Pagination', () => {
  it('states an exact total plainly, with a last-page button', () => {
    const html = render(false);
    expect(html).toContain('51–75 of 24,800');
    expect(html).toContain('Page 3 of 992');
    expect(html).toContain('Last page');
  });

  it('says "about" for an estimated total and leaves out the last-page jump', () => {
    const html = render(true);
    expect(html).toContain('51–75 of about 24,800');
    expect(html).toContain('Page 3 of about 992');
    expect(html).not.toContain('Last page');
    expect(html).toContain('Next page');
  });
});
