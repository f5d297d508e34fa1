import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { meQueryKey, type CurrentUser } from '@/lib/auth';

export interface SetPasswordBody {
  token: string;
  password: string;
  name?: string;
}

/** Sets a password from an invitation or reset link; the server signs the user in. */
export function useSetPassword() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: SetPasswordBody) => api.post<{ user: CurrentUser }>('/api/auth/set-password', body),
    onSuccess: ({ user }) => {
      // Whatever was cached belonged to whoever used this browser before. The sign-in entry
      // itself is kept and overwritten (not cleared), so the auth provider's observer sees the change.
      qc.removeQueries({ predicate: (q) => q.queryHash !== JSON.stringify(meQueryKey) });
      qc.setQueryData(meQueryKey, user);
    },
  });
}
