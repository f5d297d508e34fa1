import { queryOptions } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** What an invitation or reset link is for, and whose it is. */
export interface TokenInfo {
  purpose: 'invite' | 'reset';
  email: string;
  name: string;
}

export const authQueries = {
  all: () => ['auth'] as const,
  token: (token: string) =>
    queryOptions({
      queryKey: ['auth', 'token', token] as const,
      queryFn: () => api.get<TokenInfo>(`/api/auth/token/${encodeURIComponent(token)}`),
      // A link is either good or not; asking again will not change the answer.
      retry: false,
      staleTime: Infinity,
    }),
};
