// The weekly report's numbers on a hand-built fortnight (see fleet-week.ts), through the real service.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { startTestService, type TestService } from '../../helpers/service';
import { buildFleetWeek, D1_NAME } from './fleet-week';
import { isoWeekLabel, isoWeekStart } from '../../../shared/api/reports';

let t: TestService;
let token: string;
let ids: Awaited<ReturnType<typeof buildFleetWeek>>;
const get = (path: string) => t.api.get(path).set('Authorization', `Bearer ${token}`);

beforeAll(async () => {
  t = await startTestService();
  token = await t.token();
  ids = await buildFleetWeek(t, token);
}, 60_000);
afterAll(async () => t?.stop());

describe('ISO weeks in UTC', () => {
  it('follow ISO 8601: 2026-W01 starts Monday 29 December 2025; 3 January 2021 (a Sunday) is in 2020-W53 (worked examples from memory)', () => {
    expect(new Date(isoWeekStart('2026-W01')!).toISOString()).toBe('2025-12-29T00:00:00.000Z');
    expect(isoWeekLabel(Date.UTC(2021, 0, 3, 23, 59))).toBe('2020-W53');
    expect(isoWeekLabel(Date.UTC(2021, 0, 4))).toBe('2021-W01');
    // A year has 53 ISO weeks when it starts on a Thursday (2026), or on a Wednesday in a leap year (2020); 2025 starts on a Wednesday and is not leap.
    expect(isoWeekStart('2025-W53')).toBeNull();
    expect(new Date(isoWeekStart('2026-W53')!).toISOString()).toBe('2026-12-28T00:00:00.000Z');
    expect(isoWeekStart('2020-W53')).not.toBeNull();
  });

  it("agree with PostgreSQL's own ISO week (to_char IYYY-IW) on every day of 2020 to 2027", async () => {
    const rows = await t.service.ctx.sequelize.query<{ d: Date; w: string }>(
      `SELECT d AS d, to_char(d AT TIME ZONE 'UTC', 'IYYY-"W"IW') AS w FROM generate_series('2020-01-01'::timestamptz, '2027-12-31', '1 day') d`,
      { type: QueryTypes.SELECT },
    );
    expect(rows.length).toBeGreaterThan(2900);
    for (const r of rows) expect(isoWeekLabel(r.d.getTime())).toBe(r.w);
  });
});

describe('weekly report', () => {
  it('counts the week: 8 key-offs, 4 interrupted, half interrupted, median 49 s into the purge, 2 freeze exposures, 2 faults explained', async () => {
    const { body } = await get('/api/reports/weekly?week=2026-W47&weeks=2').expect(200);
    expect(body).toMatchObject({ week: '2026-W47', weekStart: '2026-11-16T00:00:00.000Z', weekEnd: '2026-11-23T00:00:00.000Z', depot: null });
    // interrupted at 38, 20, 60 and 90 s: the median of four is the mean of the middle two, (38 + 60) / 2 = 49
    expect(body.total).toEqual({ keyOffs: 8, interrupted: 4, shareInterrupted: 0.5, medianSecondsIntoPurge: 49, freezeExposures: 2, faultsExplained: 2 });
  });

  it('by depot and by unit, the most interruptions first', async () => {
    const { body } = await get('/api/reports/weekly?week=2026-W47&weeks=2').expect(200);
    expect(body.byDepot).toEqual([
      { depot: 'North', keyOffs: 6, interrupted: 3, shareInterrupted: 0.5, medianSecondsIntoPurge: 38, freezeExposures: 1, faultsExplained: 1 },
      { depot: 'South', keyOffs: 2, interrupted: 1, shareInterrupted: 0.5, medianSecondsIntoPurge: 90, freezeExposures: 1, faultsExplained: 1 },
    ]);
    expect(body.byUnit.map((u: { unitId: string; interrupted: number; keyOffs: number }) => [u.unitId, u.keyOffs, u.interrupted])).toEqual([
      ['N-1', 4, 2], ['N-2', 2, 1], ['S-1', 2, 1],
    ]);
    expect(body.byUnit[0]).toMatchObject({ medianSecondsIntoPurge: 29, freezeExposures: 0, faultsExplained: 1 });
  });

  it('by driver, from the assignments covering each key-off; the unassigned unit shows as no driver', async () => {
    const { body } = await get('/api/reports/weekly?week=2026-W47&weeks=2').expect(200);
    expect(body.byDriver[0]).toEqual({ driverId: ids.d2, driverName: 'Driver Two', keyOffs: 4, interrupted: 2, shareInterrupted: 0.5, medianSecondsIntoPurge: 40, freezeExposures: 1, faultsExplained: 1 });
    expect(body.byDriver.slice(1)).toEqual(expect.arrayContaining([
      expect.objectContaining({ driverId: ids.d1, driverName: D1_NAME, keyOffs: 2, interrupted: 1 }),
      expect.objectContaining({ driverId: null, driverName: null, keyOffs: 2, interrupted: 1 }),
    ]));
  });

  it('trends over ISO weeks and names the repeat offenders over the whole span', async () => {
    const { body } = await get('/api/reports/weekly?week=2026-W47&weeks=3').expect(200);
    expect(body.trend.map((w: { week: string; keyOffs: number; interrupted: number }) => [w.week, w.keyOffs, w.interrupted])).toEqual([
      ['2026-W45', 0, 0], ['2026-W46', 2, 1], ['2026-W47', 8, 4],
    ]);
    expect(body.trend[0].shareInterrupted).toBeNull();
    expect(body.repeatOffenders.units.map((u: { unitId: string; interrupted: number }) => [u.unitId, u.interrupted])).toEqual([['N-1', 3]]);
    expect(body.repeatOffenders.drivers.map((d: { driverName: string; interrupted: number }) => [d.driverName, d.interrupted])).toEqual([['Driver Two', 2]]);
  });

  it('narrows to one depot, and refuses a week that does not exist', async () => {
    const { body } = await get('/api/reports/weekly?week=2026-W47&depot=South').expect(200);
    expect(body.total).toMatchObject({ keyOffs: 2, interrupted: 1 });
    expect(body.byUnit.map((u: { unitId: string }) => u.unitId)).toEqual(['S-1']);
    for (const q of ['week=2025-W53', 'week=47', 'weeks=0', 'weeks=53']) expect((await get(`/api/reports/weekly?${q}`)).status, q).toBe(400);
  });

  it("a driver's coaching view gives the rate, the weekly trend and the latest key-offs", async () => {
    const { body } = await get(`/api/drivers/${ids.d2}/coaching?weeks=60`);
    expect(body.error.code).toBe('validation_error');
    const c = (await get(`/api/drivers/${ids.d2}/coaching?weeks=52`).expect(200)).body;
    expect(c.driver).toMatchObject({ code: 'D-2', name: 'Driver Two' });
    expect(c.totals).toMatchObject({ keyOffs: 4, interrupted: 2, shareInterrupted: 0.5 });
    expect(c.trend).toHaveLength(52);
    expect(c.trend.find((w: { week: string }) => w.week === '2026-W47')).toMatchObject({ keyOffs: 4, interrupted: 2 });
    expect(c.lastEvents.map((e: { unitId: string; outcome: string }) => [e.unitId, e.outcome])).toEqual([
      ['N-2', 'interrupted'], ['N-2', 'completed'], ['N-1', 'completed'], ['N-1', 'interrupted'],
    ]);
  });
});
