import type { Permission } from '@emberline/contracts/permissions';

export interface NavigationItem {
  label: string;
  to: string;
  permission: Permission;
}

/** The main navigation; each role sees the items its permissions allow. */
export const navigation: NavigationItem[] = [
  { label: 'Fleet', to: '/fleet', permission: 'read:engine' },
  { label: 'Review queue', to: '/review', permission: 'review:inspection' },
  { label: 'Findings', to: '/findings', permission: 'read:inspection' },
  { label: 'Limit library', to: '/limits', permission: 'read:limit-set' },
  { label: 'Planning board', to: '/planning', permission: 'read:planning' },
  { label: 'Reports', to: '/reports', permission: 'read:report' },
  { label: 'Admin', to: '/admin', permission: 'manage:user' },
];
