import { useEffect } from 'react';
import { useQuery } from '@tanstack/react-query';
import { shopQuery } from './shop-query';

/** The product's name: the title's second part on pages that belong to no shop (sign-in). */
export const PRODUCT_NAME = 'Pullbook';

/** "Runs · Kestrel Ridge Motorworks": the page's name, then whose it is. */
export function formatPageTitle(page: string | null | undefined, place: string | null | undefined): string {
  const owner = place?.trim() || PRODUCT_NAME;
  const name = page?.trim();
  return name ? `${name} · ${owner}` : owner;
}

/**
 * Sets `document.title` for the page that calls it: the one way every screen names its tab.
 * Signed-in pages give only their name and get the shop's name after it; public pages pass
 * `place` (e.g. "Pullbook" on sign-in, the report's shop on the share page), and then the shop
 * is not asked for.
 */
export function usePageTitle(page: string | null | undefined, place?: string | null): void {
  const ownShop = useQuery({ ...shopQuery(), enabled: place === undefined });
  const title = formatPageTitle(page, place === undefined ? ownShop.data?.name : place);
  useEffect(() => {
    document.title = title;
  }, [title]);
}
