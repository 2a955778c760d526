// Roster import through real HTTP, PostgreSQL and the broker: preview errors per cell, all-or-nothing commit.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestService, type TestService } from '../../helpers/service';
import { connectGateway, provision } from '../../helpers/gateway';
import { MessageSeq } from '../../helpers/messages';
import { addUser } from './helpers';

let t: TestService;
let admin: string;
let planner: string;
const auth = (token: string) => ({ Authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await startTestService();
  admin = await t.token();
  planner = (await addUser(t, admin, 'planner')).token;
  await provision(t.api, admin, { id: 'OLD-1' }, 'gw-old-1');
});
afterAll(async () => t?.stop());

const HEADER = 'unit_id,name,depot,system_voltage,purge_seconds,gateway_id';

describe('fleet roster import', () => {
  it('offers a template with the expected columns, to admins only', async () => {
    const res = await t.api.get('/api/roster/template').set(auth(admin));
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.text.split('\n')[0]).toBe(HEADER);
    expect((await t.api.get('/api/roster/template').set(auth(planner))).status).toBe(403);
    expect((await t.api.post('/api/roster/preview').set(auth(planner)).send({ csv: HEADER })).status).toBe(403);
  });

  it('a file with bad rows shows each bad cell and its line, and committing it creates nothing', async () => {
    const csv = [
      HEADER,
      'NEW-1,Tipper one,North,24,120,gw-new-1',
      'bad id!,Bad id,North,12,120,',
      'NEW-2,Volts,North,48,120,gw-new-2',
      '',
      'NEW-3,Short purge,North,12,5,gw-new-3',
      'NEW-1,Twice,North,12,120,gw-new-4',
      'OLD-1,Exists,North,12,120,gw-new-5',
      'NEW-6,Gateway taken,North,12,120,gw-old-1',
      'NEW-7,Gateway twice,North,12,,gw-new-1',
    ].join('\n');
    const before = (await t.api.get('/api/units').set(auth(admin))).body.length;
    const preview = await t.api.post('/api/roster/preview').set(auth(admin)).send({ csv });
    expect(preview.status).toBe(200);
    expect(preview.body.ok).toBe(false);
    const errorsOf = (line: number) => preview.body.rows.find((r: { line: number }) => r.line === line).errors;
    expect(errorsOf(2)).toEqual([]);
    expect(errorsOf(3)).toEqual([expect.objectContaining({ column: 'unit_id', message: expect.stringMatching(/"bad id!" is not a valid unit id/) })]);
    expect(errorsOf(4)).toEqual([{ column: 'system_voltage', message: 'system voltage must be 12 or 24, got "48"' }]);
    expect(errorsOf(6)).toEqual([{ column: 'purge_seconds', message: 'purge time must be 10–3600 s, got 5' }]);
    expect(errorsOf(7)).toEqual([{ column: 'unit_id', message: 'unit NEW-1 is also on line 2 of this file' }]);
    expect(errorsOf(8)).toEqual([{ column: 'unit_id', message: 'unit OLD-1 already exists' }]);
    expect(errorsOf(9)).toEqual([{ column: 'gateway_id', message: 'gateway gw-old-1 already exists (unit OLD-1)' }]);
    expect(errorsOf(10)).toEqual([{ column: 'gateway_id', message: 'gateway gw-new-1 is also on line 2 of this file' }]);
    expect(preview.body.errorCount).toBe(7);

    const commit = await t.api.post('/api/roster/commit').set(auth(admin)).send({ csv });
    expect(commit.status).toBe(422);
    expect(commit.body.error.code).toBe('roster_invalid');
    expect((await t.api.get('/api/units').set(auth(admin))).body.length).toBe(before);
    expect((await t.api.get('/api/units/NEW-1').set(auth(admin))).status).toBe(404);
  });

  it('names missing columns and refuses an empty upload', async () => {
    const res = await t.api.post('/api/roster/preview').set(auth(admin)).send({ csv: 'unit_id,name\nA,B\n' });
    expect(res.body.ok).toBe(false);
    expect(res.body.fileErrors[0]).toMatch(/^Missing columns: depot, system_voltage, purge_seconds, gateway_id/);
    expect((await t.api.post('/api/roster/preview').set(auth(admin)).send({ csv: '' })).status).toBe(400);
  });

  it('a good file creates the units and gateways in one go, and a gateway connects with the secret returned once', async () => {
    const csv = `\uFEFF${HEADER}\r\nRS-1,"Tipper, rear",East yard,24,150,gw-rs-1\r\nRS-2,Van two,East yard,12,,gw-rs-2\r\nRS-3,No gateway yet,West yard,12 V,90,\r\n`;
    const preview = await t.api.post('/api/roster/preview').set(auth(admin)).send({ csv });
    expect(preview.body).toMatchObject({ ok: true, errorCount: 0 });
    expect(preview.body.rows[0]).toMatchObject({ line: 2, unitId: 'RS-1', name: 'Tipper, rear', systemVoltage: 24, purgeSeconds: 150, gatewayId: 'gw-rs-1' });
    const commit = await t.api.post('/api/roster/commit').set(auth(admin)).send({ csv });
    expect(commit.status).toBe(201);
    expect(commit.body.units).toEqual(['RS-1', 'RS-2', 'RS-3']);
    expect(commit.body.gateways.map((g: { gatewayId: string }) => g.gatewayId)).toEqual(['gw-rs-1', 'gw-rs-2']);
    const unit = await t.api.get('/api/units/RS-2').set(auth(admin));
    // Empty purge time = the default of 120 s; 12 V loss threshold default 6.0 V.
    expect(unit.body).toMatchObject({ depot: 'East yard', systemVoltage: 12, purgeSeconds: 120, lossThresholdV: 6, gatewayId: 'gw-rs-2' });
    expect((await t.api.get('/api/units/RS-3').set(auth(admin))).body).toMatchObject({ systemVoltage: 12, purgeSeconds: 90, gatewayId: null });

    const { secret } = commit.body.gateways[0];
    const gw = await connectGateway(t.mqttUrl, 'gw-rs-1', secret);
    const m = new MessageSeq(1);
    await gw.publish('telemetry', m.telemetry(Date.now() - 1000, 'on', 27.9, { ambientC: 3 }));
    await gw.end();
    const seen = await t.api.get('/api/units/RS-1').set(auth(admin));
    expect(seen.body.lastSupplyV).toBe(27.9);
    await expect(connectGateway(t.mqttUrl, 'gw-rs-2', 'wrong-secret')).rejects.toThrow();
    // The same file again: every unit and gateway now exists, nothing more is created.
    const again = await t.api.post('/api/roster/commit').set(auth(admin)).send({ csv });
    expect(again.status).toBe(422);
    expect(again.body.error.details.rows[0].errors).toEqual([
      { column: 'unit_id', message: 'unit RS-1 already exists' },
      { column: 'gateway_id', message: 'gateway gw-rs-1 already exists (unit RS-1)' },
    ]);
    const audit = (await t.api.get('/api/audit').set(auth(admin))).body;
    expect(audit.find((a: { action: string }) => a.action === 'roster.import').details.units).toEqual(['RS-1', 'RS-2', 'RS-3']);
    expect(JSON.stringify(audit)).not.toContain(secret);
  });
});
