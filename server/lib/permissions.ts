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
  'reports.read': ['admin', 'monitor', 'planner', 'technician'],
  'battery.read': ['admin', 'monitor', 'planner', 'technician'],
  'drivers.read': ['admin', 'monitor', 'planner', 'technician'],
  'drivers.manage': ['admin', 'planner'],
  'workOrders.read': ['admin', 'monitor', 'planner', 'technician'],
  'workOrders.manage': ['admin', 'planner'],
  'workOrders.record': ['technician'],
  'roster.import': ['admin'],
  'mail.subscribe': ['admin', 'monitor', 'planner', 'technician'],
  'mail.admin': ['admin'],
  'depots.read': ['admin', 'monitor', 'planner', 'technician'],
  'depots.manage': ['admin'],
  'forecast.refresh': ['admin', 'planner'],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof PERMISSIONS;

export const can = (role: Role, permission: Permission) => (PERMISSIONS[permission] as readonly Role[]).includes(role);
