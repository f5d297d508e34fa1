import type { Page } from '@shared/schemas/common';

/** Lists come back as a page ({ items, total, … }) or, from simpler routes, a bare array. */
export type ListResponse<T> = Page<T> | T[] | { items: T[] };

export function itemsOf<T>(r: ListResponse<T>): T[] {
  return Array.isArray(r) ? r : r.items;
}

export function toPage<T>(r: ListResponse<T>, page = 1, pageSize = 25): Page<T> {
  if (Array.isArray(r)) return { items: r, total: r.length, page, pageSize };
  if ('total' in r) return r;
  return { items: r.items, total: r.items.length, page, pageSize };
}
