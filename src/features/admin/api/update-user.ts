import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Role } from '@shared/roles';
import { api } from '@/lib/api-client';
import { auditKeys } from '@/lib/query-keys';
import { adminQueries, type UserDto } from './admin-queries';

export interface UserPatch {
  name?: string;
  role?: Role;
  disabled?: boolean;
}

/** Changes a user's role or disables / re-enables them; the audit log records it. */
export function useUpdateUser() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, patch }: { id: string; patch: UserPatch }) => api.patch<UserDto>(`/api/users/${id}`, patch),
    onSuccess: (updated) => {
      qc.setQueryData(adminQueries.users().queryKey, (old) => old?.map((u) => (u.id === updated.id ? updated : u)));
      return Promise.all([qc.invalidateQueries({ queryKey: adminQueries.users().queryKey }), qc.invalidateQueries({ queryKey: auditKeys.all() })]);
    },
  });
}
