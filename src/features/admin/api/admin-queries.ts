import { infiniteQueryOptions, keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { Page } from '@shared/schemas/common';
import { api } from '@/lib/api-client';
import { auditKeys, outboxKeys, userKeys } from '@/lib/query-keys';

export type { UserDto, AuditEntryDto as AuditEntry } from '@shared/schemas/auth';
import type { UserDto, AuditEntryDto as AuditEntry } from '@shared/schemas/auth';

export type { CapturedMessage as OutboxItem } from '@shared/schemas/outbox';
import type { CapturedMessageDetail, OutboxPage } from '@shared/schemas/outbox';

/** The outbox list; `enabled` is false when mail goes to a real relay (nothing is captured then). */
export type OutboxList = OutboxPage;

export const AUDIT_PAGE = 100;

/**
 * The owner's settings screens. Users live under ['users'] (the customers feature invalidates
 * that key when it invites a rider); the shop is the one shopQuery() of src/lib/shop-query.ts.
 */
export const adminQueries = {
  users: () => queryOptions({ queryKey: userKeys.all(), queryFn: async () => (await api.get<Page<UserDto>>('/api/users')).items }),
  /** The audit log, optionally narrowed on the server to some kinds of action ("run", "user"…). */
  audit: (kinds: readonly string[] = []) =>
    infiniteQueryOptions({
      queryKey: auditKeys.list(kinds.join(',')),
      queryFn: ({ pageParam }) => api.get<Page<AuditEntry>>('/api/audit', { before: pageParam, limit: AUDIT_PAGE, kinds: kinds.length ? kinds.join(',') : undefined }),
      initialPageParam: undefined as string | undefined,
      // Keep the previous kind's rows on screen while the narrowed log loads.
      placeholderData: keepPreviousData,
      // The log is newest first; the server's cursor is the time of the oldest entry shown.
      getNextPageParam: (last) => last.nextCursor ?? undefined,
      select: (data) => ({ ...data, pages: data.pages.map((p) => p.items) }),
    }),
  outbox: () => queryOptions({ queryKey: outboxKeys.list(), queryFn: () => api.get<OutboxList>('/api/outbox') }),
  outboxMessage: (id: string) =>
    queryOptions({
      queryKey: outboxKeys.message(id),
      queryFn: () => api.get<CapturedMessageDetail>(`/api/outbox/${encodeURIComponent(id)}`),
      staleTime: Infinity,
    }),
};

export const outboxAttachmentUrl = (id: string, index: number) => `/api/outbox/${encodeURIComponent(id)}/attachments/${index}`;
