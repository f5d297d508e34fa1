import { infiniteQueryOptions, keepPreviousData, queryOptions } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { auditKeys, outboxKeys, userKeys } from '@/lib/query-keys';

export type { UserDto, AuditEntryDto as AuditEntry } from '@shared/schemas/auth';
import type { UserDto, AuditEntryDto as AuditEntry } from '@shared/schemas/auth';

export type { CapturedMessage as OutboxItem } from '@shared/schemas/outbox';
import type { CapturedMessage as OutboxItem } from '@shared/schemas/outbox';

export interface OutboxList {
  /** False when mail goes to a real relay: nothing is captured here then. */
  enabled: boolean;
  items: OutboxItem[];
}

export const AUDIT_PAGE = 100;

/**
 * The owner's settings screens. Users live under ['users'] (the customers feature invalidates
 * that key when it invites a rider); the shop is the one shopQuery() of src/lib/shop-query.ts.
 */
export const adminQueries = {
  users: () => queryOptions({ queryKey: userKeys.all(), queryFn: () => api.get<UserDto[]>('/api/users') }),
  /** The audit log, optionally narrowed on the server to some kinds of action ("run", "user"…). */
  audit: (kinds: readonly string[] = []) =>
    infiniteQueryOptions({
      queryKey: auditKeys.list(kinds.join(',')),
      queryFn: ({ pageParam }) => api.get<AuditEntry[]>('/api/audit', { before: pageParam, limit: AUDIT_PAGE, kinds: kinds.length ? kinds.join(',') : undefined }),
      initialPageParam: undefined as string | undefined,
      // Keep the previous kind's rows on screen while the narrowed log loads.
      placeholderData: keepPreviousData,
      // The log is newest first; the next page is everything before the oldest entry shown.
      getNextPageParam: (last) => (last.length < AUDIT_PAGE ? undefined : last[last.length - 1].at),
    }),
  outbox: () => queryOptions({ queryKey: outboxKeys.list(), queryFn: () => api.get<OutboxList>('/api/outbox') }),
  outboxMessage: (id: string) =>
    queryOptions({
      queryKey: outboxKeys.message(id),
      queryFn: () => api.get<OutboxItem & { html: string | null }>(`/api/outbox/${encodeURIComponent(id)}`),
      staleTime: Infinity,
    }),
};

export const outboxAttachmentUrl = (id: string, index: number) => `/api/outbox/${encodeURIComponent(id)}/attachments/${index}`;
