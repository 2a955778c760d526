// Drivers and assignments through the real service: the admin form, the CSV import (preview, errors per cell, all or nothing), roles.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { startTestService, type TestService } from '../../helpers/service';

let t: TestService;
const tokens: Record<string, string> = {};
const as = (role: string) => ({ Authorization: `Bearer ${tokens[role]}` });
const ROLES = ['admin', 'monitor', 'planner', 'technician'];

beforeAll(async () => {
  t = await startTestService();
  tokens.admin = await t.token();
  for (const id of ['DR-1', 'DR-2']) await t.api.post('/api/units').set(as('admin')).send({ id, name: `Unit ${id}`, depot: 'West', systemVoltage: 24 }).expect(201);
  for (const role of ROLES.slice(1)) {
    await t.api.post('/api/users').set(as('admin')).send({ email: `${role}@test.local`, name: role, role, password: `${role}-password-1` }).expect(201);
    tokens[role] = await t.token(`${role}@test.local`, `${role}-password-1`);
  }
});
afterAll(async () => t?.stop());

const csv = (rows: string[][]) => Papa.unparse([['driver_code', 'driver_name', 'unit_id', 'from', 'to'], ...rows], { newline: '\r\n' });

describe('assignments CSV import', () => {
  it('previews every row with an error per bad cell, and a commit with any error writes nothing (422)', async () => {
    const file = csv([
      ['W-1', 'Driver West One', 'DR-1', '2026-11-23T05:30:00Z', '2026-11-23T16:00:00Z'],
      ['W-2', '', 'DR-9', '23/11/2026 06:00', ''],
      ['W-1', '', 'DR-1', '2026-11-23T15:00:00Z', '2026-11-23T14:00:00Z'],
      ['W-1', '', 'DR-1', '2026-11-23T15:00:00+01:00', ''],
      ['bad code!', 'X', 'DR-2', '2026-11-24T06:00:00Z', ''],
    ]);
    const preview = (await t.api.post('/api/drivers/assignments/import').set(as('planner')).send({ csv: file }).expect(200)).body;
    expect(preview.committed).toBe(false);
    expect(preview.rows.map((r: { line: number; errors: { column: string }[] }) => [r.line, r.errors.map((e) => e.column)])).toEqual([
      [2, ['from']], // overlaps line 5: both rows of a clash are marked
      [3, ['driver_name', 'unit_id', 'from']],
      [4, ['to']],
      [5, ['from']], // 15:00+01:00 is 14:00 UTC, inside line 2's 05:30–16:00 on the same unit
      [6, ['driver_code']],
    ]);
    expect(preview.rows[1].errors.find((e: { column: string }) => e.column === 'unit_id').message).toBe('no unit DR-9');
    expect(preview.rows[3].errors[0].message).toBe('overlaps line 2 for DR-1');
    expect(preview.rows[0].newDriver).toBe(true);
    expect(preview.rows[0].errors[0].message).toBe('overlaps line 5 for DR-1');
    const commit = await t.api.post('/api/drivers/assignments/import').set(as('planner')).send({ csv: file, commit: true });
    expect(commit.status).toBe(422);
    expect(commit.body.error).toMatchObject({ code: 'import_rejected', details: { errorCount: 7 } });
    expect((await t.api.get('/api/drivers').set(as('planner'))).body).toEqual([]);
    expect((await t.api.get('/api/drivers/assignments').set(as('planner'))).body).toEqual([]);
  });

  it('a clean file commits every row at once, creating the new drivers; the same file again overlaps itself', async () => {
    const file = csv([
      ['W-1', 'Driver West One', 'DR-1', '2026-11-23T05:30:00Z', '2026-11-23T16:00:00Z'],
      ['W-1', '', 'DR-1', '2026-11-24T05:30:00Z', ''],
      ['W-2', 'Driver West Two', 'DR-2', '2026-11-23 05:30:00Z', ''],
    ]);
    const res = (await t.api.post('/api/drivers/assignments/import').set(as('planner')).send({ csv: file, commit: true }).expect(200)).body;
    expect(res).toMatchObject({ committed: true, created: 3, errorCount: 0 });
    const drivers = (await t.api.get('/api/drivers').set(as('technician')).expect(200)).body;
    expect(drivers.map((d: { code: string; name: string }) => [d.code, d.name])).toEqual([['W-1', 'Driver West One'], ['W-2', 'Driver West Two']]);
    const list = (await t.api.get('/api/drivers/assignments?unitId=DR-1').set(as('monitor')).expect(200)).body;
    expect(list.map((a: { from: string; to: string | null; driverCode: string }) => [a.driverCode, a.from, a.to])).toEqual([
      ['W-1', '2026-11-24T05:30:00.000Z', null],
      ['W-1', '2026-11-23T05:30:00.000Z', '2026-11-23T16:00:00.000Z'],
    ]);
    const again = (await t.api.post('/api/drivers/assignments/import').set(as('admin')).send({ csv: file }).expect(200)).body;
    expect(again.rows.every((r: { errors: { column: string }[] }) => r.errors.some((e) => e.column === 'from'))).toBe(true);
  });

  it('refuses a file with the wrong header, and serves a template whose header the import accepts', async () => {
    const bad = await t.api.post('/api/drivers/assignments/import').set(as('admin')).send({ csv: 'driver,unit\r\nA,B\r\n' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details).toEqual({ missing: ['driver_code', 'unit_id', 'from'], unknown: ['driver', 'unit'] });
    const tpl = await t.api.get('/api/drivers/assignments/template.csv').set(as('planner')).expect(200);
    expect(tpl.headers['content-disposition']).toMatch(/attachment/);
    expect(tpl.text.split('\r\n')[0]).toBe('driver_code,driver_name,unit_id,from,to');
  });
});

describe('assignments form', () => {
  it('adds an assignment, refuses an overlapping one with 409, and deletes', async () => {
    const d = (await t.api.post('/api/drivers').set(as('planner')).send({ code: 'W-3', name: 'Driver West Three' }).expect(201)).body;
    const a = await t.api.post('/api/drivers/assignments').set(as('planner')).send({ driverId: d.id, unitId: 'DR-2', from: '2026-11-20T06:00:00Z', to: '2026-11-21T06:00:00Z' }).expect(201);
    const clash = await t.api.post('/api/drivers/assignments').set(as('planner')).send({ driverId: d.id, unitId: 'DR-2', from: '2026-11-20T12:00:00Z', to: '2026-11-20T18:00:00Z' });
    expect(clash.status).toBe(409);
    expect(clash.body.error.message).toMatch(/already assigned to Driver West Three/);
    const noZone = await t.api.post('/api/drivers/assignments').set(as('planner')).send({ driverId: d.id, unitId: 'DR-2', from: '2026-11-19T06:00:00' });
    expect(noZone.status).toBe(400);
    expect((await t.api.post('/api/drivers').set(as('planner')).send({ code: 'w-3', name: 'Dup' })).status).toBe(409);
    await t.api.delete(`/api/drivers/assignments/${a.body.id}`).set(as('admin')).expect(204);
    expect((await t.api.delete(`/api/drivers/assignments/${a.body.id}`).set(as('admin'))).status).toBe(404);
  });
});

describe('who may do what', () => {
  const routes: { method: 'get' | 'post' | 'patch' | 'delete'; path: string; body?: object; allowed: string[] }[] = [
    { method: 'get', path: '/api/history/episodes', allowed: ROLES },
    { method: 'get', path: '/api/history/faults/export.csv', allowed: ROLES },
    { method: 'get', path: '/api/reports/weekly', allowed: ROLES },
    { method: 'get', path: '/api/battery', allowed: ROLES },
    { method: 'get', path: '/api/drivers', allowed: ROLES },
    { method: 'get', path: '/api/drivers/assignments', allowed: ROLES },
    { method: 'post', path: '/api/drivers', body: { code: 'R-X', name: 'Role check' }, allowed: ['admin', 'planner'] },
    { method: 'patch', path: '/api/drivers/999999', body: { name: 'Y' }, allowed: ['admin', 'planner'] },
    { method: 'post', path: '/api/drivers/assignments', body: {}, allowed: ['admin', 'planner'] },
    { method: 'post', path: '/api/drivers/assignments/import', body: { csv: 'x' }, allowed: ['admin', 'planner'] },
    { method: 'delete', path: '/api/drivers/assignments/999999', allowed: ['admin', 'planner'] },
  ];
  for (const r of routes)
    it(`${r.method.toUpperCase()} ${r.path}: open to ${r.allowed.join(', ')}; closed to the rest and without a token`, async () => {
      for (const role of ROLES) {
        const req = t.api[r.method](r.path).set(as(role));
        const res = r.body ? await req.send(r.body) : await req;
        if (r.allowed.includes(role)) expect([401, 403], `${role}`).not.toContain(res.status);
        else expect(res.status, role).toBe(403);
      }
      expect((await t.api[r.method](r.path)).status).toBe(401);
    });
});
