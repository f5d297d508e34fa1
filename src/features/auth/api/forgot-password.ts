import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** Asks for a reset link by e-mail. The answer is the same whether or not the address has an account. */
export function useForgotPassword() {
  return useMutation({
    mutationFn: (body: { email: string }) => api.post<{ ok: true; message: string }>('/api/auth/forgot', body),
  });
}
