import type { RouteObject } from 'react-router-dom';
import { paths } from '@/config/paths';

/** Signed-out pages, shown without the app shell. */
export const authRoutes: RouteObject[] = [
  { path: paths.login, lazy: async () => ({ Component: (await import('./pages/login-page')).default }) },
  { path: paths.forgotPassword, lazy: async () => ({ Component: (await import('./pages/forgot-password-page')).default }) },
  {
    path: paths.resetPassword(),
    lazy: async () => {
      const { default: SetPasswordPage } = await import('./pages/set-password-page');
      return { Component: () => <SetPasswordPage purpose="reset" /> };
    },
  },
  {
    path: paths.invite(),
    lazy: async () => {
      const { default: SetPasswordPage } = await import('./pages/set-password-page');
      return { Component: () => <SetPasswordPage purpose="invite" /> };
    },
  },
];

/** The signed-in user's own page. */
export const accountRoutes: RouteObject[] = [{ path: paths.account, lazy: async () => ({ Component: (await import('./pages/account-page')).default }) }];
