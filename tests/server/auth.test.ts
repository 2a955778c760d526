import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import jwt from 'jsonwebtoken';
import { ADMIN, startTestService, type TestService } from '../helpers/service';

let t: TestService;
beforeAll(async () => {
  t = await startTestService({ LOGIN_RATE_LIMIT: '5' });
});
afterAll(async () => t?.stop());

describe('sign-in', () => {
  it('gives a token and the user for the right e-mail and password', async () => {
    const res = await t.api.post('/api/auth/login').send({ email: ADMIN.email, password: ADMIN.password });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ email: ADMIN.email, role: 'admin', name: expect.any(String), id: expect.any(Number) });
    const claims = jwt.decode(res.body.token) as { exp: number; iat: number };
    expect(claims.exp - claims.iat).toBe(12 * 3600);
    const me = await t.api.get('/api/auth/me').set('Authorization', `Bearer ${res.body.token}`);
    expect(me.body.user.email).toBe(ADMIN.email);
  });

  it('answers a wrong password or an unknown e-mail with 401 in the contract\'s error shape', async () => {
    for (const body of [{ email: ADMIN.email, password: 'wrong-password' }, { email: 'nobody@test.local', password: 'whatever-else' }]) {
      const res = await t.api.post('/api/auth/login').send(body);
      expect(res.status).toBe(401);
      expect(res.body).toEqual({ error: { code: 'invalid_credentials', message: 'Wrong e-mail or password' } });
    }
  });

  it('refuses a malformed body with 400 validation_error', async () => {
    const res = await t.api.post('/api/auth/login').send({ email: 'not-an-email' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_error');
  });

  it('slows guessing: after the limit of failed attempts the same e-mail gets 429', async () => {
    const email = 'guess@test.local';
    const codes: number[] = [];
    for (let i = 0; i < 7; i++) codes.push((await t.api.post('/api/auth/login').send({ email, password: `guess-${i}` })).status);
    expect(codes.slice(0, 5)).toEqual([401, 401, 401, 401, 401]);
    expect(codes.slice(5)).toEqual([429, 429]);
    const res = await t.api.post('/api/auth/login').send({ email, password: 'again' });
    expect(res.body.error.code).toBe('rate_limited');
  });

  it('refuses a missing, forged or expired token with 401', async () => {
    expect((await t.api.get('/api/units')).status).toBe(401);
    const forged = jwt.sign({ sub: '1', email: ADMIN.email, name: 'x', role: 'admin' }, 'another-secret-entirely');
    expect((await t.api.get('/api/units').set('Authorization', `Bearer ${forged}`)).status).toBe(401);
    const expired = jwt.sign({ sub: '1', email: ADMIN.email, name: 'x', role: 'admin' }, 'test-secret-of-sufficient-length', { expiresIn: -10 });
    const res = await t.api.get('/api/units').set('Authorization', `Bearer ${expired}`);
    expect(res.status).toBe(401);
    expect(res.body.error.message).toMatch(/expired/);
  });

  it('a deactivated user can neither sign in nor use an earlier token', async () => {
    const admin = await t.token();
    const created = await t.api.post('/api/users').set('Authorization', `Bearer ${admin}`).send({ email: 'leaver@test.local', name: 'Leaver', role: 'monitor', password: 'leaver-password' });
    expect(created.status).toBe(201);
    const token = await t.token('leaver@test.local', 'leaver-password');
    const off = await t.api.patch(`/api/users/${created.body.id}`).set('Authorization', `Bearer ${admin}`).send({ active: false });
    expect(off.body.active).toBe(false);
    expect((await t.api.get('/api/units').set('Authorization', `Bearer ${token}`)).status).toBe(401);
    expect((await t.api.post('/api/auth/login').send({ email: 'leaver@test.local', password: 'leaver-password' })).status).toBe(401);
  });

  it('an admin cannot demote or deactivate themselves', async () => {
    const admin = await t.token();
    const me = (await t.api.get('/api/auth/me').set('Authorization', `Bearer ${admin}`)).body.user;
    const res = await t.api.patch(`/api/users/${me.id}`).set('Authorization', `Bearer ${admin}`).send({ role: 'monitor' });
    expect(res.status).toBe(409);
  });

  it('writes who created and changed users into the audit log', async () => {
    const admin = await t.token();
    const log = await t.api.get('/api/audit').set('Authorization', `Bearer ${admin}`);
    const actions = log.body.map((e: { action: string }) => e.action);
    expect(actions).toContain('user.create');
    expect(actions).toContain('user.update');
    expect(log.body.find((e: { action: string }) => e.action === 'user.update').actor.email).toBe(ADMIN.email);
  });
});
