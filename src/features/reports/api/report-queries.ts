import { queryOptions } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { reportKeys } from '@/lib/query-keys';
import type { Delivery, PublicShare, ReportDetail, ReportSummary, ShareLinkView } from './types';

export const reportQueries = {
  all: reportKeys.all,
  list: (filter: { bikeId?: string; comparisonId?: string } = {}) =>
    queryOptions({ queryKey: reportKeys.list(filter), queryFn: () => api.get<ReportSummary[]>('/api/reports', filter) }),
  detail: (id: string) => queryOptions({ queryKey: reportKeys.detail(id), queryFn: () => api.get<ReportDetail>(`/api/reports/${id}`) }),
  deliveries: (id: string) => queryOptions({ queryKey: reportKeys.deliveries(id), queryFn: () => api.get<Delivery[]>(`/api/reports/${id}/deliveries`) }),
  shares: (id: string) => queryOptions({ queryKey: reportKeys.shares(id), queryFn: () => api.get<ShareLinkView[]>(`/api/reports/${id}/share`) }),
  publicShare: (token: string) =>
    queryOptions({ queryKey: reportKeys.publicShare(token), queryFn: () => api.get<PublicShare>(`/api/share/${encodeURIComponent(token)}`), retry: false, staleTime: Infinity }),
};
