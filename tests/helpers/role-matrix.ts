// Every role against every route: one signed-in user of each role, and for each route either "not
// refused for its role" (not 401/403) or 403 forbidden, plus 401 without a token.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestService, type TestService } from './service';

export const ALL_ROLES = ['admin', 'monitor', 'planner', 'technician'];

export interface MatrixRoute {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  path: string;
  body?: object;
  allowed: string[];
}

export function roleMatrix(title: string, routes: MatrixRoute[], prepare?: (t: TestService, adminToken: string) => Promise<void>) {
  let t: TestService;
  const tokens: Record<string, string> = {};
  beforeAll(async () => {
    t = await startTestService();
    tokens.admin = await t.token();
    await prepare?.(t, tokens.admin);
    for (const role of ALL_ROLES.slice(1)) {
      const email = `${role}@test.local`;
      await t.api.post('/api/users').set('Authorization', `Bearer ${tokens.admin}`).send({ email, name: role, role, password: `${role}-password-1` });
      tokens[role] = await t.token(email, `${role}-password-1`);
    }
  });
  afterAll(async () => t?.stop());

  describe(title, () => {
    for (const route of routes) {
      for (const role of ALL_ROLES) {
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
}
