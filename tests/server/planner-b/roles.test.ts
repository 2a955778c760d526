// The README's role table for the planner's desk B routes, every role against every route.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestService, type TestService } from '../../helpers/service';

const ALL = ['admin', 'monitor', 'planner', 'technician'];
type Route = { method: 'get' | 'post' | 'put' | 'delete'; path: string; body?: object; allowed: string[] };
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

let t: TestService;
const tokens: Record<string, string> = {};
beforeAll(async () => {
  t = await startTestService();
  tokens.admin = await t.token();
  for (const role of ALL.slice(1)) {
    const email = `${role}@test.local`;
    await t.api.post('/api/users').set('Authorization', `Bearer ${tokens.admin}`).send({ email, name: role, role, password: `${role}-password-1` });
    tokens[role] = await t.token(email, `${role}-password-1`);
  }
});
afterAll(async () => t?.stop());

describe('role matrix of work orders, roster, mail and forecast', () => {
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
