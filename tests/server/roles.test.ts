import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestService, type TestService } from '../helpers/service';

// The README's role table, route by route. ALL = every role; ADMIN = admins only.
const ALL = ['admin', 'monitor', 'planner', 'technician'];
const ADMIN = ['admin'];
type Route = { method: 'get' | 'post' | 'patch' | 'delete'; path: string; body?: object; allowed: string[] };
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
];

let t: TestService;
const tokens: Record<string, string> = {};
beforeAll(async () => {
  t = await startTestService();
  tokens.admin = await t.token();
  await t.api.post('/api/units').set('Authorization', `Bearer ${tokens.admin}`).send({ id: 'RM-1', name: 'Role matrix unit', depot: 'North', systemVoltage: 12 });
  for (const role of ALL.slice(1)) {
    const email = `${role}@test.local`;
    await t.api.post('/api/users').set('Authorization', `Bearer ${tokens.admin}`).send({ email, name: role, role, password: `${role}-password-1` });
    tokens[role] = await t.token(email, `${role}-password-1`);
  }
});
afterAll(async () => t?.stop());

describe('role matrix', () => {
  for (const route of ROUTES) {
    for (const role of ALL) {
      const allowed = route.allowed.includes(role);
      it(`${route.method.toUpperCase()} ${route.path} is ${allowed ? 'open' : 'closed'} to ${role}`, async () => {
        const req = t.api[route.method](route.path).set('Authorization', `Bearer ${tokens[role]}`);
        const res = route.body ? await req.send(route.body) : await req;
        if (allowed) expect([401, 403]).not.toContain(res.status);
        else {
          expect(res.status).toBe(403);
          expect(res.body.error.code).toBe('forbidden');
        }
      });
    }
    it(`${route.method.toUpperCase()} ${route.path} needs a token`, async () => {
      expect((await t.api[route.method](route.path)).status).toBe(401);
    });
  }
});
