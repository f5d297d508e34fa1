import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { RunDetailDto, RunStatusId, RunSummaryDto } from '@shared/schemas/run';
import type { BikeDto } from '@shared/schemas/bike';
import type { CustomerDto } from '@shared/schemas/customer';
import { api } from '@/lib/api-client';
import { bikeKeys, customerKeys, runKeys } from '@/lib/query-keys';
import { itemsOf, toPage, type ListResponse } from '../list-response';

/** Filters of the run list; the same names as the API's query (runListQuery) and the page URL. */
export interface RunFilters {
  bikeId?: string;
  customerId?: string;
  stageId?: string;
  sessionId?: string;
  tag?: string;
  status?: RunStatusId;
  from?: string;
  to?: string;
  sort?: string;
  page?: number;
  pageSize?: number;
  includeDeleted?: boolean;
}

/** The first rows of a file as the reader split them, to choose columns by hand. */
export interface RunPreview {
  headers: string[];
  rows: string[][];
  suggestions: Record<string, unknown>;
  /** Roles the reader could not settle ('rpm', 'torque', 'power'); empty when not told. */
  needs: string[];
}

interface RawPreview {
  headers?: string[];
  previewRows?: string[][];
  rows?: string[][];
  suggestions?: Record<string, unknown>;
  needs?: string[];
}

export function normalisePreview(p: RawPreview | null | undefined): RunPreview {
  return { headers: p?.headers ?? [], rows: p?.previewRows ?? p?.rows ?? [], suggestions: p?.suggestions ?? {}, needs: Array.isArray(p?.needs) ? p.needs : [] };
}

export const runQueries = {
  all: runKeys.all,
  lists: runKeys.lists,
  list: (filters: RunFilters) =>
    queryOptions({
      queryKey: runKeys.list(filters),
      queryFn: async () => toPage(await api.get<ListResponse<RunSummaryDto>>('/api/runs', { ...filters }), filters.page, filters.pageSize),
      placeholderData: keepPreviousData,
    }),
  details: runKeys.details,
  detail: (id: string) =>
    queryOptions({
      queryKey: runKeys.detail(id),
      queryFn: () => api.get<RunDetailDto>(`/api/runs/${id}`),
    }),
  preview: (id: string) =>
    queryOptions({
      queryKey: runKeys.preview(id),
      queryFn: async () => normalisePreview(await api.get<RawPreview>(`/api/runs/${id}/preview`)),
      staleTime: Infinity,
    }),
};

/** Bikes and customers to pick from, as plain arrays (under the resources' 'options' keys). */
export const lookupQueries = {
  bikes: (q: string) =>
    queryOptions({
      queryKey: bikeKeys.options({ q, pageSize: 50 }),
      queryFn: async () => itemsOf(await api.get<ListResponse<BikeDto>>('/api/bikes', { q: q || undefined, pageSize: 50 })),
      placeholderData: keepPreviousData,
    }),
  /** Every bike of the shop (up to the API's page limit), for filter menus. */
  allBikes: () =>
    queryOptions({
      queryKey: bikeKeys.options({ pageSize: 200, sort: 'make' }),
      queryFn: async () => itemsOf(await api.get<ListResponse<BikeDto>>('/api/bikes', { pageSize: 200, sort: 'make' })),
      staleTime: 5 * 60_000,
    }),
  bike: (id: string) =>
    queryOptions({ queryKey: bikeKeys.detail(id), queryFn: () => api.get<BikeDto>(`/api/bikes/${id}`) }),
  customers: () =>
    queryOptions({
      queryKey: customerKeys.options({ pageSize: 200, sort: 'name' }),
      queryFn: async () => itemsOf(await api.get<ListResponse<CustomerDto>>('/api/customers', { pageSize: 200, sort: 'name' })),
      staleTime: 5 * 60_000,
    }),
};

export { bikeLabel } from '@shared/labels';
