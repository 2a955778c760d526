import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestService, type TestService } from '../helpers/service';

let t: TestService;
let admin: string;
const auth = () => ({ Authorization: `Bearer ${admin}` });
beforeAll(async () => {
  t = await startTestService();
  admin = await t.token();
});
afterAll(async () => t?.stop());

describe('units and gateways API', () => {
  it('creates a 24 V unit with the protocol defaults and lists it in the GET shape', async () => {
    const res = await t.api.post('/api/units').set(auth()).send({ id: 'TK-24', name: 'Crane truck', depot: 'Harbour', systemVoltage: 24 });
    expect(res.status).toBe(201);
    // Protocol: purge default 120 s (common practice, no published source); loss threshold 12.0 V for 24 V systems.
    expect(res.body).toMatchObject({ id: 'TK-24', name: 'Crane truck', depot: 'Harbour', systemVoltage: 24, purgeSeconds: 120, lossThresholdV: 12, gatewayId: null, state: null, stateSince: null, purgeRemainingS: null });
    const list = await t.api.get('/api/units').set(auth());
    expect(list.body.map((u: { id: string }) => u.id)).toContain('TK-24');
    const keys = Object.keys(list.body[0]);
    for (const k of ['id', 'name', 'depot', 'systemVoltage', 'purgeSeconds', 'gatewayId', 'state', 'stateSince', 'purgeRemainingS']) expect(keys).toContain(k);
  });

  it('uses 6.0 V as the loss threshold of a 12 V unit and keeps given values', async () => {
    const a = await t.api.post('/api/units').set(auth()).send({ id: 'TK-12', name: 'Van', depot: 'Harbour', systemVoltage: 12 });
    expect(a.body.lossThresholdV).toBe(6);
    const b = await t.api.post('/api/units').set(auth()).send({ id: 'TK-12b', name: 'Van', depot: 'Harbour', systemVoltage: 12, purgeSeconds: 90, lossThresholdV: 8.5, linkSpns: [1234] });
    expect(b.body).toMatchObject({ purgeSeconds: 90, lossThresholdV: 8.5, linkSpns: [1234] });
  });

  it('refuses bad units clearly: duplicate 409, bad id or purge time 400, unknown 404', async () => {
    expect((await t.api.post('/api/units').set(auth()).send({ id: 'TK-12', name: 'Again', depot: 'X', systemVoltage: 12 })).status).toBe(409);
    const bad = await t.api.post('/api/units').set(auth()).send({ id: '-bad id', name: 'X', depot: 'X', systemVoltage: 36, purgeSeconds: 5 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('validation_error');
    expect(bad.body.error.message).toMatch(/id/);
    expect(bad.body.error.message).toMatch(/purgeSeconds/);
    expect((await t.api.post('/api/units').set(auth()).send({ id: 'TK-x', name: 'X', depot: 'X', systemVoltage: 12, purgeSeconds: 3601 })).status).toBe(400);
    expect((await t.api.get('/api/units/NOPE').set(auth())).status).toBe(404);
  });

  it('edits a unit\'s profile and writes the change to the audit log', async () => {
    const res = await t.api.patch('/api/units/TK-12').set(auth()).send({ purgeSeconds: 180, depot: 'Ridge' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ purgeSeconds: 180, depot: 'Ridge' });
    const log = await t.api.get('/api/audit').set(auth());
    expect(log.body.find((e: { action: string; target: string }) => e.action === 'unit.update' && e.target === 'unit:TK-12')).toBeTruthy();
  });

  it('provisions a gateway with a secret shown once, and a new gateway replaces the unit\'s previous one', async () => {
    const first = await t.api.post('/api/gateways').set(auth()).send({ gatewayId: 'gw-a', unitId: 'TK-24' });
    expect(first.status).toBe(201);
    expect(first.body).toEqual({ gatewayId: 'gw-a', secret: expect.stringMatching(/^[A-Za-z0-9_-]{40,}$/) });
    expect((await t.api.post('/api/gateways').set(auth()).send({ gatewayId: 'gw-a', unitId: 'TK-12' })).status).toBe(409);
    expect((await t.api.post('/api/gateways').set(auth()).send({ gatewayId: 'gw-z', unitId: 'NOPE' })).status).toBe(404);
    const second = await t.api.post('/api/gateways').set(auth()).send({ gatewayId: 'gw-b', unitId: 'TK-24' });
    expect(second.status).toBe(201);
    const list = await t.api.get('/api/gateways').set(auth());
    const byId = Object.fromEntries(list.body.map((g: { gatewayId: string }) => [g.gatewayId, g]));
    expect(byId['gw-a'].revokedAt).not.toBeNull();
    expect(byId['gw-b'].revokedAt).toBeNull();
    expect(JSON.stringify(list.body)).not.toContain(first.body.secret);
    expect((await t.api.get('/api/units/TK-24').set(auth())).body.gatewayId).toBe('gw-b');
  });
});
