import { markRaw, type Component } from 'vue';
import { House, User } from '@element-plus/icons-vue';
import { ROLES, type Role } from '@shared/schemas/user';
import type { RouteName } from './route-map';

export interface NavigationEntry {
  routeName: RouteName;
  label: string;
  icon: Component;
  roles: readonly Role[];
  /** Plain words of what the role does there, for the landing page. */
  summary: string;
}

/** The rail, in order. Keep `roles` equal to the route's `meta.roles` (a test checks it). */
export const navigation: readonly NavigationEntry[] = [
  {
    routeName: 'home',
    label: 'Overview',
    icon: markRaw(House),
    roles: ROLES,
    summary: 'Start here: the areas your role works in.',
  },
  {
    routeName: 'admin-users',
    label: 'Users',
    icon: markRaw(User),
    roles: ['admin'],
    summary: 'Add people, give each the role for their job, and switch off accounts no longer used.',
  },
];

/** The entries a role may open, in rail order; nobody signed in gets none. */
export function navigationFor(role: Role | null): NavigationEntry[] {
  if (role === null) return [];
  return navigation.filter((entry) => entry.roles.includes(role));
}
