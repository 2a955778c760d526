import type { Role } from '../lib/session-store';

export interface NavItem {
  to: string;
  label: string;
  /** Roles that see the link; omitted = every role. Must match the route's own guard. */
  roles?: readonly Role[];
  /** main: the live view; plan: the planner's desk; admin: administration. */
  group: 'main' | 'plan' | 'admin';
}

// Add a page: register its route in router.tsx, then list it here. Only link pages that exist.
export const NAV_ITEMS: readonly NavItem[] = [
  { to: '/board', label: 'Board', group: 'main' },
  { to: '/alerts', label: 'Alerts', group: 'main' },
  { to: '/units', label: 'Units', group: 'main' },
  { to: '/history', label: 'History', group: 'plan' },
  { to: '/reports', label: 'Weekly report', group: 'plan' },
  { to: '/drivers', label: 'Drivers', group: 'plan' },
  { to: '/battery', label: 'Battery drain', group: 'plan' },
  { to: '/admin/users', label: 'Users', roles: ['admin'], group: 'admin' },
  { to: '/admin/units', label: 'Units & profiles', roles: ['admin'], group: 'admin' },
  { to: '/admin/gateways', label: 'Gateways', roles: ['admin'], group: 'admin' },
  { to: '/admin/audit', label: 'Audit log', roles: ['admin'], group: 'admin' },
  { to: '/admin/switch-sheet', label: 'Switch codes', roles: ['admin'], group: 'admin' },
  { to: '/work-orders', label: 'Work orders', group: 'plan' },
  { to: '/depots', label: 'Depots & forecast', group: 'plan' },
  { to: '/settings/mail', label: 'E-mail alerts', group: 'plan' },
  { to: '/admin/roster', label: 'Roster import', roles: ['admin'], group: 'admin' },
  { to: '/admin/mailbox', label: 'Mailbox', roles: ['admin'], group: 'admin' },
];

export function navFor(role: Role, items: readonly NavItem[] = NAV_ITEMS): NavItem[] {
  return items.filter((i) => !i.roles || i.roles.includes(role));
}
