import type { Page } from '@shared/schemas/common';
import { queryOptions } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { reportKeys } from '@/lib/query-keys';
import type { Delivery, PublicShare, ReportDetail, ReportSummary, ShareLinkView } from './types';

export const reportQueries = {
  all: reportKeys.all,
  list: (filter: { bikeId?: string; comparisonId?: string } = {}) =>
    queryOptions({ queryKey: reportKeys.list(filter), queryFn: async () => (await api.get<Page<ReportSummary>>('/api/reports', filter)).items }),
  detail: (id: string) => queryOptions({ queryKey: reportKeys.detail(id), queryFn: () => api.get<ReportDetail>(`/api/reports/${id}`) }),
  deliveries: (id: string) => queryOptions({ queryKey: reportKeys.deliveries(id), queryFn: async () => (await api.get<Page<Delivery>>(`/api/reports/${id}/deliveries`)).items }),
  shares: (id: string) => queryOptions({ queryKey: reportKeys.shares(id), queryFn: async () => (await api.get<Page<ShareLinkView>>(`/api/reports/${id}/share`)).items }),
  publicShare: (token: string) =>
    queryOptions({ queryKey: reportKeys.publicShare(token), queryFn: () => api.get<PublicShare>(`/api/share/${encodeURIComponent(token)}`), retry: false, staleTime: Infinity }),
};
