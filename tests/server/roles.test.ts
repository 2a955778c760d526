import { ALL_ROLES as ALL, roleMatrix, type MatrixRoute as Route } from '../helpers/role-matrix';

// The README's role table, route by route. ALL = every role; ADMIN = admins only.
const ADMIN = ['admin'];
const ROUTES: Route[] = [
  { method: 'get', path: '/api/auth/me', allowed: ALL },
  { method: 'get', path: '/api/units', allowed: ALL },
  { method: 'get', path: '/api/units/RM-1', allowed: ALL },
  { method: 'post', path: '/api/units', body: { id: 'RM-NEW', name: 'New', depot: 'North', systemVoltage: 12 }, allowed: ADMIN },
  { method: 'patch', path: '/api/units/RM-1', body: { purgeSeconds: 150 }, allowed: ADMIN },
  { method: 'get', path: '/api/gateways', allowed: ADMIN },
  { method: 'post', path: '/api/gateways', body: { gatewayId: 'gw-new', unitId: 'RM-1' }, allowed: ADMIN },
  { method: 'delete', path: '/api/gateways/gw-unknown', allowed: ADMIN },
  { method: 'get', path: '/api/users', allowed: ADMIN },
  { method: 'post', path: '/api/users', body: { email: 'x@test.local', name: 'X', role: 'monitor', password: 'long-enough-pw' }, allowed: ADMIN },
  { method: 'patch', path: '/api/users/999999', body: { name: 'Y' }, allowed: ADMIN },
  { method: 'get', path: '/api/audit', allowed: ADMIN },
  { method: 'get', path: '/api/episodes', allowed: ALL },
  { method: 'get', path: '/api/faults', allowed: ALL },
  { method: 'get', path: '/api/units/RM-1/readings', allowed: ALL },
  { method: 'get', path: '/api/units/RM-1/timeline', allowed: ALL },
  { method: 'get', path: '/api/alerts', allowed: ALL },
  { method: 'post', path: '/api/alerts/999999/acknowledge', body: {}, allowed: ['admin', 'monitor'] },
  { method: 'post', path: '/api/alerts/999999/resolve', body: {}, allowed: ['admin', 'monitor'] },
  { method: 'get', path: '/api/switch-pages', allowed: ADMIN },
  { method: 'post', path: '/api/switch-pages/RM-1', allowed: ADMIN },
  { method: 'delete', path: '/api/switch-pages/RM-1', allowed: ADMIN },
  { method: 'get', path: '/api/metrics', allowed: ADMIN },
];

roleMatrix('role matrix', ROUTES, async (t, admin) => {
  await t.api.post('/api/units').set('Authorization', `Bearer ${admin}`).send({ id: 'RM-1', name: 'Role matrix unit', depot: 'North', systemVoltage: 12 });
});
