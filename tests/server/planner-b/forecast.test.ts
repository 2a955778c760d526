// The forecast through real HTTP: the fake answers Open-Meteo's forecast format (from memory), the
// service keeps each depot's 48-hour low and warns parked units whose purge is unfinished when the low
// reaches the DEF freezing point, -11 °C (ISO 22241-1).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestService, type TestService } from '../../helpers/service';
import { connectGateway, provision } from '../../helpers/gateway';
import { MessageSeq } from '../../helpers/messages';
import { startForecastFake } from '../../../server/dev-fakes/forecast-fake';
import { addUser, interruptedUnit, until } from './helpers';

let t: TestService;
let admin: string;
const auth = (token: string) => ({ Authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await startTestService();
  admin = await t.token();
});
afterAll(async () => t?.stop());

/** Hourly temperatures from 00:00 UTC today: mild, then `low` from `fromHour` for three hours. */
function coldSpell(low: number, fromHour: number) {
  return Array.from({ length: 72 }, (_, h) => (h >= fromHour && h < fromHour + 3 ? low : 1.5));
}

describe('forecast fake', () => {
  it('answers the documented request with hourly times and temperatures, and refuses a bad one', async () => {
    const res = await fetch(`${t.service.forecastFake!.url}/v1/forecast?latitude=61.5&longitude=23.8&hourly=temperature_2m&forecast_days=2&timezone=UTC`);
    const body = await res.json();
    expect(res.status).toBe(200);
    expect(body.hourly.time).toHaveLength(48);
    expect(body.hourly.temperature_2m).toHaveLength(48);
    expect(body.hourly.time[0]).toMatch(/^\d{4}-\d{2}-\d{2}T00:00$/);
    expect(body.hourly_units.temperature_2m).toBe('°C');
    const bad = await fetch(`${t.service.forecastFake!.url}/v1/forecast?latitude=200&longitude=0&hourly=temperature_2m`);
    expect(bad.status).toBe(400);
  });
});

describe('depots and forecast warnings', () => {
  it('an admin sets depot coordinates; others read them; bad coordinates are refused', async () => {
    await provision(t.api, admin, { id: 'FC-0', depot: 'Map yard' });
    const planner = await addUser(t, admin, 'planner');
    expect((await t.api.put('/api/depots/Map%20yard').set(auth(planner.token)).send({ latitude: 60, longitude: 20 })).status).toBe(403);
    expect((await t.api.put('/api/depots/Map%20yard').set(auth(admin)).send({ latitude: 95, longitude: 20 })).status).toBe(400);
    const set = await t.api.put('/api/depots/Map%20yard').set(auth(admin)).send({ latitude: 60.25, longitude: 20.5 });
    expect(set.body).toEqual({ name: 'Map yard', latitude: 60.25, longitude: 20.5, unitCount: 1 });
    const list = await t.api.get('/api/depots').set(auth(planner.token));
    expect(list.body).toContainEqual({ name: 'Map yard', latitude: 60.25, longitude: 20.5, unitCount: 1 });
  });

  it('a parked unit with an interrupted purge at a depot forecast to reach -11 °C gets a warning with the time to act', async () => {
    const alert = await interruptedUnit(t, admin, { id: 'FC-1', depot: 'Cold yard' });
    // A unit driving (key on) at the same depot is not warned: its purge will run at the next key-off.
    const g = await provision(t.api, admin, { id: 'FC-2', depot: 'Cold yard' });
    const gw = await connectGateway(t.mqttUrl, g.gatewayId, g.secret);
    await gw.publish('telemetry', new MessageSeq(1).telemetry(Date.now() - 500, 'on', 13.9, { ambientC: -2 }));
    await gw.end();
    // An interrupted unit at a mild depot is not warned either.
    await interruptedUnit(t, admin, { id: 'FC-3', depot: 'Mild yard' });
    await t.api.put('/api/depots/Cold%20yard').set(auth(admin)).send({ latitude: 64.1, longitude: 27.7 });
    await t.api.put('/api/depots/Mild%20yard').set(auth(admin)).send({ latitude: 45.2, longitude: 5.7 });
    const nowHour = new Date().getUTCHours();
    // -11.0 exactly counts: "at or under" the freezing point (ISO 22241-1).
    t.service.forecastFake!.setSeries(64.1, 27.7, coldSpell(-11, nowHour + 20));
    t.service.forecastFake!.setSeries(45.2, 5.7, coldSpell(-10.9, nowHour + 20));

    const refresh = await t.api.post('/api/forecast/refresh').set(auth(admin));
    expect(refresh.status).toBe(200);
    const expectedAt = new Date(Date.UTC(new Date().getUTCFullYear(), new Date().getUTCMonth(), new Date().getUTCDate()) + (nowHour + 20) * 3600_000).toISOString();
    expect(refresh.body.depots).toEqual(expect.arrayContaining([
      { depot: 'Cold yard', lowC: -11, lowAt: expectedAt, error: null },
      { depot: 'Mild yard', lowC: -10.9, lowAt: expectedAt, error: null },
    ]));
    expect(refresh.body.alerts.map((a: { unitId: string }) => a.unitId)).toEqual(['FC-1']);
    const [warning] = refresh.body.alerts;
    expect(warning).toMatchObject({ kind: 'forecastFreeze', status: 'open', depot: 'Cold yard', episodeId: alert.episodeId });
    expect(warning.comment).toMatch(/−11\.0 °C .* from \d{4}-\d{2}-\d{2} \d{2}:00 UTC\. Run a full purge before then\./);

    const warnings = await t.api.get('/api/forecast/warnings').set(auth(admin));
    expect(warnings.body).toEqual([{ alertId: warning.id, unitId: 'FC-1', depot: 'Cold yard', lowC: -11, lowAt: expectedAt, actBy: expectedAt, status: 'open' }]);
    const lows = await t.api.get('/api/forecast').set(auth(admin));
    const cold = lows.body.find((f: { depot: string }) => f.depot === 'Cold yard');
    expect(cold.lowC).toBe(-11);
    expect(cold.hours.length).toBeGreaterThanOrEqual(48);
    const listed = await t.api.get('/api/alerts?unitId=FC-1&status=open').set(auth(admin));
    expect(listed.body.map((a: { kind: string }) => a.kind).sort()).toEqual(['forecastFreeze', 'interruptedPurge']);

    // Refreshing again raises nothing new for the same episode.
    expect((await t.api.post('/api/forecast/refresh').set(auth(admin))).body.alerts).toEqual([]);
    const technician = await addUser(t, admin, 'technician');
    expect((await t.api.post('/api/forecast/refresh').set(auth(technician.token))).status).toBe(403);
  });

  it('a purge still running when the freeze is forecast is warned, and the warning settles when the purge completes', async () => {
    const g = await provision(t.api, admin, { id: 'FC-4', depot: 'Hill yard', purgeSeconds: 120 });
    const gw = await connectGateway(t.mqttUrl, g.gatewayId, g.secret);
    const m = new MessageSeq(1);
    const t0 = Date.now() - 2000;
    await gw.publish('telemetry', m.telemetry(t0, 'on', 13.9, { ambientC: -3 }));
    await gw.publish('telemetry', m.telemetry(t0 + 500, 'off', 12.6, { ambientC: -3 }));
    await t.api.put('/api/depots/Hill%20yard').set(auth(admin)).send({ latitude: 62.5, longitude: 30.1 });
    t.service.forecastFake!.setSeries(62.5, 30.1, coldSpell(-18, new Date().getUTCHours() + 6));
    const refresh = await t.api.post('/api/forecast/refresh').set(auth(admin));
    const warning = refresh.body.alerts.find((a: { unitId: string }) => a.unitId === 'FC-4');
    expect(warning).toMatchObject({ kind: 'forecastFreeze', status: 'open' });
    // The controller goes to sleep: the purge is complete (gateway protocol: ecmAwake false after key-off).
    await gw.publish('telemetry', m.telemetry(t0 + 30_000, 'off', 12.5, { ambientC: -3, ecmAwake: false }));
    await gw.end();
    const settled = await until(async () => {
      const res = await t.api.get('/api/alerts?unitId=FC-4').set(auth(admin));
      return res.body.find((a: { id: number; status: string }) => a.id === warning.id && a.status === 'resolved');
    });
    expect(settled.comment).toMatch(/settled: completed$/);
    expect((await t.api.get('/api/forecast/warnings').set(auth(admin))).body.map((w: { unitId: string }) => w.unitId)).not.toContain('FC-4');
  });

  it('with FORECAST_URL set, the service asks that server and starts no fake of its own', async () => {
    const external = await startForecastFake({ host: '127.0.0.1', port: 0 });
    const s = await startTestService({ FORECAST_URL: external.url });
    try {
      expect(s.service.forecastFake).toBeNull();
      const a = await s.token();
      await provision(s.api, a, { id: 'EX-1', depot: 'Far yard' });
      await s.api.put('/api/depots/Far%20yard').set(auth(a)).send({ latitude: 10, longitude: 10 });
      const before = external.requests();
      const res = await s.api.post('/api/forecast/refresh').set(auth(a));
      expect(res.body.depots).toEqual([expect.objectContaining({ depot: 'Far yard', error: null })]);
      expect(external.requests()).toBe(before + 1);
    } finally {
      await s.stop();
      await external.close();
    }
  });
});
