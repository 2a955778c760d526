// Which role may do what. The README's role table is this map in words; tests walk it route by route.
import type { Role } from '../db/models/user';

export const PERMISSIONS = {
  'units.read': ['admin', 'monitor', 'planner', 'technician'],
  'episodes.read': ['admin', 'monitor', 'planner', 'technician'],
  'faults.read': ['admin', 'monitor', 'planner', 'technician'],
  'alerts.read': ['admin', 'monitor', 'planner', 'technician'],
  'alerts.handle': ['admin', 'monitor'],
  'units.write': ['admin'],
  'gateways.manage': ['admin'],
  'users.manage': ['admin'],
  'audit.read': ['admin'],
  'switch.manage': ['admin'],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof PERMISSIONS;

export const can = (role: Role, permission: Permission) => (PERMISSIONS[permission] as readonly Role[]).includes(role);
