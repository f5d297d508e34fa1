import { queryOptions } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Delivery, PublicShare, ReportDetail, ReportSummary, ShareLinkView } from './types';

export const reportQueries = {
  all: ['reports'] as const,
  list: (filter: { bikeId?: string; comparisonId?: string } = {}) =>
    queryOptions({ queryKey: ['reports', 'list', filter], queryFn: () => api.get<ReportSummary[]>('/api/reports', filter) }),
  detail: (id: string) => queryOptions({ queryKey: ['reports', 'detail', id], queryFn: () => api.get<ReportDetail>(`/api/reports/${id}`) }),
  deliveries: (id: string) => queryOptions({ queryKey: ['reports', 'deliveries', id], queryFn: () => api.get<Delivery[]>(`/api/reports/${id}/deliveries`) }),
  shares: (id: string) => queryOptions({ queryKey: ['reports', 'shares', id], queryFn: () => api.get<ShareLinkView[]>(`/api/reports/${id}/share`) }),
  publicShare: (token: string) =>
    queryOptions({ queryKey: ['share', token], queryFn: () => api.get<PublicShare>(`/api/share/${encodeURIComponent(token)}`), retry: false, staleTime: Infinity }),
};
