import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** Changes the signed-in user's own password. Nothing cached depends on it, so nothing is invalidated. */
export function useChangePassword() {
  return useMutation({
    mutationFn: (body: { currentPassword: string; newPassword: string }) => api.post<{ ok: true }>('/api/auth/password', body),
  });
}
