import { createContext, useContext, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { STAFF, type Role } from '@shared/roles';
import type { SignedInUser } from '@shared/schemas/auth';
import { api, ApiError } from './api-client';
import { authKeys } from './query-keys';
import { usePageTitle } from './page-title';
import { paths } from '@/config/paths';

/** The user GET /api/auth/me answers with (the server's actor). */
export type CurrentUser = SignedInUser;

interface AuthState {
  user: CurrentUser | null;
  isLoading: boolean;
  signIn(email: string, password: string): Promise<CurrentUser>;
  signOut(): Promise<void>;
  setUser(user: CurrentUser): void;
}

const AuthContext = createContext<AuthState | null>(null);
export const meQueryKey = authKeys.me();

export function AuthProvider({ children }: { children: ReactNode }) {
  const qc = useQueryClient();
  const me = useQuery({
    queryKey: meQueryKey,
    queryFn: async () => {
      try {
        return await api.get<CurrentUser>('/api/auth/me');
      } catch (e) {
        if (e instanceof ApiError && e.status === 401) return null;
        throw e;
      }
    },
    staleTime: 5 * 60_000,
  });
  const login = useMutation({
    mutationFn: (v: { email: string; password: string }) => api.post<{ user: CurrentUser }>('/api/auth/login', v),
  });
  const state: AuthState = {
    user: me.data ?? null,
    isLoading: me.isLoading,
    async signIn(email, password) {
      const { user } = await login.mutateAsync({ email, password });
      // Another user's cached data must not survive a sign-in; the new sign-in itself must.
      qc.removeQueries({ predicate: (q) => q.queryKey[0] !== meQueryKey[0] });
      qc.setQueryData(meQueryKey, user);
      return user;
    },
    async signOut() {
      await api.post('/api/auth/logout').catch(() => undefined);
      qc.removeQueries({ predicate: (q) => q.queryKey[0] !== meQueryKey[0] });
      qc.setQueryData(meQueryKey, null);
    },
    setUser(user) {
      qc.setQueryData(meQueryKey, user);
    },
  };
  return <AuthContext.Provider value={state}>{children}</AuthContext.Provider>;
}

export function useAuth(): AuthState {
  const ctx = useContext(AuthContext);
  if (!ctx) throw new Error('useAuth outside AuthProvider');
  return ctx;
}

/** The signed-in user; only for components rendered inside the signed-in shell. */
export function useCurrentUser(): CurrentUser {
  const { user } = useAuth();
  if (!user) throw new Error('useCurrentUser needs a signed-in user');
  return user;
}

export function hasRole(user: CurrentUser | null, roles: readonly Role[]) {
  return Boolean(user && roles.includes(user.role));
}

/** Who a page is for, in words: "shop staff", "the shop owner", "owners and tuners". */
export function audienceOf(roles: readonly Role[]): string {
  if (STAFF.every((r) => roles.includes(r)) && !roles.includes('customer')) return 'shop staff';
  if (roles.length === 1 && roles[0] === 'owner') return 'the shop owner';
  const plural: Record<Role, string> = { owner: 'owners', tuner: 'tuners', desk: 'front-desk staff', customer: 'customers' };
  const names = roles.map((r) => plural[r]);
  return names.length <= 1 ? (names[0] ?? 'nobody') : `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
}

/** "you are signed in as …": "an owner", "a tuner", "front-desk staff", "a customer". */
export const SIGNED_IN_AS: Record<Role, string> = { owner: 'an owner', tuner: 'a tuner', desk: 'front-desk staff', customer: 'a customer' };

/**
 * Renders its children only for the given roles; others get a plain "not for your role" page
 * instead of a screen whose requests would all answer 403. Wrap a route's element with it.
 */
export function RequireRole({ roles, children }: { roles: readonly Role[]; children: ReactNode }) {
  const { user } = useAuth();
  if (!hasRole(user, roles)) return <NotForYourRole audience={audienceOf(roles)} />;
  return <>{children}</>;
}

/**
 * The plain page for someone whose role may not see a screen (a guard above, or the API's 403
 * under a route): who the page is for, who they are, and the way home. No "Try again": a retry
 * cannot change the answer.
 */
export function NotForYourRole({ audience = 'shop staff' }: { audience?: string }) {
  const { user } = useAuth();
  usePageTitle('Not available for your role');
  return (
    <div role="alert" className="mx-auto max-w-xl rounded-card border border-line bg-paper-raised p-6 text-ink">
      <h1 className="text-xl font-semibold">Not available for your role</h1>
      <p className="mt-2 text-ink-muted">
        This page is for {audience}
        {user ? `; you are signed in as ${SIGNED_IN_AS[user.role]}` : ''}.
      </p>
      <p className="mt-4">
        <Link to={paths.home} className="focus-ring rounded-control font-semibold text-accent underline">
          Go to the start page
        </Link>
      </p>
    </div>
  );
}
