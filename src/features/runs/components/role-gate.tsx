import type { ReactNode } from 'react';
import type { Role } from '@shared/roles';
import { EmptyState } from '@/components/ui';
import { useCurrentUser } from '@/lib/auth';

/** Shows its children only to the given roles; the server enforces the same rule. */
export function RoleGate({ roles, message, children }: { roles: readonly Role[]; message: string; children: ReactNode }) {
  const user = useCurrentUser();
  if (!roles.includes(user.role)) return <EmptyState icon="octagon" title="Not available for your account" message={message} />;
  return <>{children}</>;
}
