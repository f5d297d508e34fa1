import { queryOptions } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { authKeys } from '@/lib/query-keys';

/** What an invitation or reset link is for, and whose it is. */
export interface TokenInfo {
  purpose: 'invite' | 'reset';
  email: string;
  name: string;
}

export const authQueries = {
  all: authKeys.all,
  token: (token: string) =>
    queryOptions({
      queryKey: authKeys.token(token),
      queryFn: () => api.get<TokenInfo>(`/api/auth/token/${encodeURIComponent(token)}`),
      // A link is either good or not; asking again will not change the answer.
      retry: false,
      staleTime: Infinity,
    }),
};
