import type { Role } from '@shared/roles';
import { paths } from '@/config/paths';

export interface NavItem {
  label: string;
  to: string;
  roles: readonly Role[];
}

/** Navigation by role. Customers see only their own garage. */
export const NAV: NavItem[] = [
  { label: 'Today', to: paths.home, roles: ['owner', 'tuner', 'desk'] },
  { label: 'My bikes', to: paths.home, roles: ['customer'] },
  { label: 'Upload runs', to: paths.upload, roles: ['owner', 'tuner'] },
  { label: 'Runs', to: paths.runs, roles: ['owner', 'tuner', 'desk'] },
  { label: 'Customers', to: paths.customers, roles: ['owner', 'tuner', 'desk'] },
  { label: 'Bikes', to: paths.bikes, roles: ['owner', 'tuner', 'desk'] },
  { label: 'Comparisons', to: paths.comparisons, roles: ['owner', 'tuner', 'desk'] },
  { label: 'Gain reports', to: paths.reports, roles: ['owner', 'tuner', 'desk'] },
  { label: 'Build finder', to: paths.finder, roles: ['owner', 'tuner', 'desk'] },
  { label: 'Bay board', to: paths.bay, roles: ['owner', 'tuner', 'desk'] },
  { label: 'Inbox', to: paths.inbox, roles: ['owner', 'tuner', 'desk'] },
];

export const ADMIN_NAV: NavItem[] = [
  { label: 'Users', to: paths.users, roles: ['owner'] },
  { label: 'Shop settings', to: paths.shopSettings, roles: ['owner'] },
  { label: 'Dynos', to: paths.dynos, roles: ['owner'] },
  { label: 'Audit log', to: paths.audit, roles: ['owner'] },
  { label: 'Outbox', to: paths.outbox, roles: ['owner'] },
];
