// The README's role table for the planner's desk B routes, every role against every route.
import { ALL_ROLES as ALL, roleMatrix, type MatrixRoute as Route } from '../../helpers/role-matrix';

const ROUTES: Route[] = [
  { method: 'get', path: '/api/work-orders', allowed: ALL },
  { method: 'get', path: '/api/work-orders/999999', allowed: ALL },
  { method: 'get', path: '/api/work-orders/technicians', allowed: ['admin', 'planner'] },
  { method: 'post', path: '/api/work-orders', body: { source: { kind: 'alert', id: 999999 } }, allowed: ['admin', 'planner'] },
  { method: 'post', path: '/api/work-orders/999999/assign', body: { assigneeId: 1 }, allowed: ['admin', 'planner'] },
  { method: 'post', path: '/api/work-orders/999999/close', body: { outcome: 'cancelled' }, allowed: ['admin', 'planner'] },
  { method: 'post', path: '/api/work-orders/999999/checks', body: { key: 'isolator', result: 'pass' }, allowed: ['technician'] },
  { method: 'post', path: '/api/work-orders/999999/photos', allowed: ['technician'] },
  { method: 'get', path: '/api/work-orders/999999/photos/1', allowed: ALL },
  { method: 'get', path: '/api/roster/template', allowed: ['admin'] },
  { method: 'post', path: '/api/roster/preview', body: { csv: 'x' }, allowed: ['admin'] },
  { method: 'post', path: '/api/roster/commit', body: { csv: 'x' }, allowed: ['admin'] },
  { method: 'get', path: '/api/mail/subscriptions', allowed: ALL },
  { method: 'post', path: '/api/mail/subscriptions', body: { depot: 'North' }, allowed: ALL },
  { method: 'delete', path: '/api/mail/subscriptions?depot=North', allowed: ALL },
  { method: 'get', path: '/api/mail/status', allowed: ['admin'] },
  { method: 'get', path: '/api/mail/mailbox', allowed: ['admin'] },
  { method: 'get', path: '/api/mail/mailbox/999999', allowed: ['admin'] },
  { method: 'post', path: '/api/mail/digest', allowed: ['admin'] },
  { method: 'get', path: '/api/depots', allowed: ALL },
  { method: 'put', path: '/api/depots/North', body: { latitude: 60, longitude: 20 }, allowed: ['admin'] },
  { method: 'get', path: '/api/forecast', allowed: ALL },
  { method: 'get', path: '/api/forecast/warnings', allowed: ALL },
  { method: 'post', path: '/api/forecast/refresh', allowed: ['admin', 'planner'] },
];

roleMatrix('role matrix of work orders, roster, mail and forecast', ROUTES);
