// Work orders through real HTTP and PostgreSQL: from an alert to closed, with checks, photos and roles.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestService, type TestService } from '../../helpers/service';
import { addUser, interruptedUnit, tinyPng } from './helpers';

let t: TestService;
let admin: string;
let planner: Awaited<ReturnType<typeof addUser>>;
let tech: Awaited<ReturnType<typeof addUser>>;
let otherTech: Awaited<ReturnType<typeof addUser>>;
let monitor: Awaited<ReturnType<typeof addUser>>;
const auth = (token: string) => ({ Authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await startTestService();
  admin = await t.token();
  planner = await addUser(t, admin, 'planner');
  tech = await addUser(t, admin, 'technician');
  otherTech = await addUser(t, admin, 'technician', 'other-tech@test.local');
  monitor = await addUser(t, admin, 'monitor');
});
afterAll(async () => t?.stop());

describe('work orders', () => {
  it('a planner opens one from an alert, the assigned technician records the coil and a photo, the planner closes it', async () => {
    const alert = await interruptedUnit(t, admin, { id: 'WO-24', systemVoltage: 24 });
    const techs = await t.api.get('/api/work-orders/technicians').set(auth(planner.token));
    expect(techs.body.map((u: { email: string }) => u.email)).toEqual(expect.arrayContaining([tech.email, otherTech.email]));

    const created = await t.api.post('/api/work-orders').set(auth(planner.token)).send({ source: { kind: 'alert', id: alert.id }, assigneeId: tech.id });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({
      unitId: 'WO-24', status: 'open', systemVoltage: 24, assignee: { id: tech.id },
      source: { kind: 'alert', alertId: alert.id, episodeId: alert.episodeId, faultId: null },
    });
    const id = created.body.id as number;

    // Someone else's order: another technician may not record on it; a monitor may not record at all.
    expect((await t.api.post(`/api/work-orders/${id}/checks`).set(auth(otherTech.token)).send({ key: 'coilResistance', ohms: 300 })).status).toBe(403);
    expect((await t.api.post(`/api/work-orders/${id}/checks`).set(auth(monitor.token)).send({ key: 'coilResistance', ohms: 300 })).status).toBe(403);

    // 150 Ω on a 24 V system is under 200–400 Ω (common practice, no published source): low.
    const coil = await t.api.post(`/api/work-orders/${id}/checks`).set(auth(tech.token)).send({ key: 'coilResistance', ohms: 150, note: 'measured at 85/86 out of socket' });
    expect(coil.status).toBe(200);
    expect(coil.body.status).toBe('inProgress');
    expect(coil.body.checks).toEqual([
      expect.objectContaining({ key: 'coilResistance', ohms: 150, verdict: 'low', systemVoltage: 24, band: { minOhms: 200, maxOhms: 400, source: 'common practice, no published source' }, recordedBy: tech.email }),
    ]);
    // Recorded again: the newer reading replaces the older one.
    const again = await t.api.post(`/api/work-orders/${id}/checks`).set(auth(tech.token)).send({ key: 'coilResistance', ohms: 310 });
    expect(again.body.checks.find((c: { key: string }) => c.key === 'coilResistance')).toMatchObject({ ohms: 310, verdict: 'pass' });
    const defCheck = await t.api.post(`/api/work-orders/${id}/checks`).set(auth(tech.token)).send({ key: 'defFreezeDamage', result: 'fail', note: 'dosing line split near the pump' });
    expect(defCheck.body.checks.find((c: { key: string }) => c.key === 'defFreezeDamage')).toMatchObject({ verdict: 'fail', note: 'dosing line split near the pump' });
    const badCheck = await t.api.post(`/api/work-orders/${id}/checks`).set(auth(tech.token)).send({ key: 'coilResistance', ohms: -5 });
    expect(badCheck.status).toBe(400);
    expect(badCheck.body.error.code).toBe('validation_error');

    const png = tinyPng();
    const photo = await t.api.post(`/api/work-orders/${id}/photos`).set(auth(tech.token)).attach('photo', png, { filename: 'pump.png', contentType: 'image/png' });
    expect(photo.status).toBe(201);
    const [p] = photo.body.photos;
    expect(p).toMatchObject({ originalName: 'pump.png', mime: 'image/png', sizeBytes: png.length, uploadedBy: tech.email });
    const back = await t.api.get(p.url).set(auth(planner.token)).buffer(true).parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(back.status).toBe(200);
    expect(back.headers['content-type']).toBe('image/png');
    expect(Buffer.compare(back.body as Buffer, png)).toBe(0);
    expect((await t.api.get(p.url)).status).toBe(401);

    expect((await t.api.post(`/api/work-orders/${id}/close`).set(auth(tech.token)).send({ outcome: 'repaired' })).status).toBe(403);
    const closed = await t.api.post(`/api/work-orders/${id}/close`).set(auth(planner.token)).send({ outcome: 'repaired', note: 'relay and dosing line replaced' });
    expect(closed.body).toMatchObject({ status: 'closed', outcome: 'repaired', closedBy: planner.email, outcomeNote: 'relay and dosing line replaced' });
    expect((await t.api.post(`/api/work-orders/${id}/checks`).set(auth(tech.token)).send({ key: 'isolator', result: 'pass' })).status).toBe(409);

    const audit = (await t.api.get('/api/audit').set(auth(admin))).body.map((a: { action: string }) => a.action);
    expect(audit).toEqual(expect.arrayContaining(['workOrder.create', 'workOrder.check', 'workOrder.photo', 'workOrder.close']));
    const listed = await t.api.get('/api/work-orders?status=closed').set(auth(monitor.token));
    expect(listed.body.map((w: { id: number }) => w.id)).toContain(id);
  });

  it('refuses photos that are not JPEG, PNG or WebP by content, or over 8 MB', async () => {
    const alert = await interruptedUnit(t, admin, { id: 'WO-PH' });
    const { body } = await t.api.post('/api/work-orders').set(auth(planner.token)).send({ source: { kind: 'alert', id: alert.id }, assigneeId: tech.id });
    const fakePng = await t.api.post(`/api/work-orders/${body.id}/photos`).set(auth(tech.token)).attach('photo', Buffer.from('not really an image'), { filename: 'x.png', contentType: 'image/png' });
    expect(fakePng.status).toBe(415);
    expect(fakePng.body.error.code).toBe('unsupported_media_type');
    const big = Buffer.concat([tinyPng(), Buffer.alloc(8 * 1024 * 1024)]);
    const tooBig = await t.api.post(`/api/work-orders/${body.id}/photos`).set(auth(tech.token)).attach('photo', big, { filename: 'big.png', contentType: 'image/png' });
    expect(tooBig.status).toBe(413);
    const none = await t.api.post(`/api/work-orders/${body.id}/photos`).set(auth(tech.token)).field('x', '1');
    expect(none.status).toBe(400);
    const order = await t.api.get(`/api/work-orders/${body.id}`).set(auth(tech.token));
    expect(order.body.photos).toEqual([]);
  });

  it('opens from an episode, keeps the link, closes only as cancelled before any record, and checks who may open and assign', async () => {
    const alert = await interruptedUnit(t, admin, { id: 'WO-EP' });
    expect((await t.api.post('/api/work-orders').set(auth(monitor.token)).send({ source: { kind: 'episode', id: alert.episodeId } })).status).toBe(403);
    expect((await t.api.post('/api/work-orders').set(auth(tech.token)).send({ source: { kind: 'episode', id: alert.episodeId } })).status).toBe(403);
    const missing = await t.api.post('/api/work-orders').set(auth(planner.token)).send({ source: { kind: 'fault', id: 999999 } });
    expect(missing.status).toBe(404);
    const created = await t.api.post('/api/work-orders').set(auth(admin)).send({ source: { kind: 'episode', id: alert.episodeId } });
    expect(created.body).toMatchObject({ unitId: 'WO-EP', assignee: null, source: { kind: 'episode', episodeId: alert.episodeId, alertId: null } });
    const notTech = await t.api.post(`/api/work-orders/${created.body.id}/assign`).set(auth(planner.token)).send({ assigneeId: monitor.id });
    expect(notTech.status).toBe(400);
    const assigned = await t.api.post(`/api/work-orders/${created.body.id}/assign`).set(auth(planner.token)).send({ assigneeId: otherTech.id });
    expect(assigned.body.assignee).toMatchObject({ id: otherTech.id, email: otherTech.email });
    expect((await t.api.post(`/api/work-orders/${created.body.id}/close`).set(auth(planner.token)).send({ outcome: 'repaired' })).status).toBe(409);
    const cancelled = await t.api.post(`/api/work-orders/${created.body.id}/close`).set(auth(planner.token)).send({ outcome: 'cancelled' });
    expect(cancelled.body).toMatchObject({ status: 'closed', outcome: 'cancelled' });
  });
});
