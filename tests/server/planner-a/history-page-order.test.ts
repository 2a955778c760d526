// The history page through the real service and PostgreSQL: for every sort column and both directions,
// pages put together give exactly the filtered rows in order, with the driver, depot and fault count of
// each row; also after a unit moves depot and when a driver is the filter. Many episodes share a key-off
// time (as a fleet's scheduled shifts do), so the order between them comes from the tie-breaker alone.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EPISODE_SORTS, type EpisodeSort, type HistoryEpisodeRow } from '../../../shared/api/history-query';
import { startTestService, type TestService } from '../../helpers/service';

const H = 3_600_000;
const T0 = Date.UTC(2026, 10, 2);
const HOURS = 12;
const UNITS = [
  { id: 'E-1', depot: 'East' }, { id: 'E-2', depot: 'East' }, { id: 'E-3', depot: 'East' }, { id: 'E-4', depot: 'East' }, { id: 'E-5', depot: 'East' },
  { id: 'W-1', depot: 'West' }, { id: 'W-2', depot: 'West' },
];
const FREEZE = ['none', 'atRisk', 'frozen'];

interface Ref {
  id: number; unitId: string; driverId: number | null; driverName: string | null; keyOffAt: number; outcome: string;
  secondsIntoPurge: number | null; ambientC: number | null; freezeExposure: string | null; faultCount: number;
}

let t: TestService;
let token: string;
const depotOf = new Map(UNITS.map((u) => [u.id, u.depot]));
let rows: Ref[] = [];
let assignments: { driverId: number; driverName: string; unitId: string; from: number; to: number | null }[] = [];
const get = (path: string) => t.api.get(path).set('Authorization', `Bearer ${token}`);

// The driver of an episode: the assignment of its unit covering its key-off (from <= t < to).
const driverAt = (unitId: string, at: number) => assignments.find((a) => a.unitId === unitId && a.from <= at && (a.to === null || at < a.to)) ?? null;

beforeAll(async () => {
  t = await startTestService();
  token = await t.token();
  const auth = { Authorization: `Bearer ${token}` };
  for (const u of UNITS) await t.api.post('/api/units').set(auth).send({ id: u.id, name: `Tractor ${u.id}`, depot: u.depot, systemVoltage: 12 }).expect(201);

  // Every unit keys off on the hour, twelve times; the rows go in in a scrambled order so that ids
  // say nothing about time or unit.
  const planned = UNITS.flatMap((u, i) => Array.from({ length: HOURS }, (_, h) => {
    const interrupted = (i + h) % 4 === 0;
    return {
      unitId: u.id, h, keyOffAt: T0 + h * H, outcome: interrupted ? 'interrupted' : 'completed',
      secondsIntoPurge: interrupted ? 10 + ((i * 7 + h * 3) % 80) : null,
      ambientC: (i + h) % 5 === 0 ? null : -10 + ((i * 3 + h) % 15),
      freezeExposure: (i + 2 * h) % 5 === 0 ? null : FREEZE[(i * 2 + h) % 3],
    };
  }));
  const scrambled = planned.map((p, k) => ({ p, k: (k * 37) % planned.length })).sort((a, b) => a.k - b.k).map((x) => x.p);
  const db = t.service.ctx.sequelize;
  for (const p of scrambled) {
    const [[{ id }]] = (await db.query(
      `INSERT INTO episodes (unit_id, stream, boot, seq, key_off_at, purge_seconds, loss_threshold_v, outcome, settled_by, ended_at, seconds_into_purge, ambient_c, freeze_exposure, final)
       VALUES ($1, 0, 1, $2, $3, 120, 6, $4, $5, $3::timestamptz + interval '2 minutes', $6, $7, $8, true) RETURNING id`,
      { bind: [p.unitId, p.h, new Date(p.keyOffAt).toISOString(), p.outcome, p.outcome === 'interrupted' ? 'supplyLost' : 'powerHeld', p.secondsIntoPurge, p.ambientC, p.freezeExposure] },
    )) as unknown as [[{ id: string }]];
    // An interrupted purge on an even hour leaves one fault at the next key-on, on E-1 two
    // (invented SPNs in the range SAE J1939 leaves to manufacturers, 520192–524287, from memory).
    const faults = p.outcome === 'interrupted' && p.h % 2 === 0 ? (p.unitId === 'E-1' ? 2 : 1) : 0;
    for (let f = 0; f < faults; f++) {
      await db.query(`INSERT INTO faults (unit_id, at, source_address, spn, fmi, lamps, episode_id) VALUES ($1, $2, 0, $3, 18, '{}', $4)`,
        { bind: [p.unitId, new Date(p.keyOffAt + 30 * 60_000).toISOString(), 520200 + f, id] });
    }
    rows.push({ id: Number(id), unitId: p.unitId, driverId: null, driverName: null, keyOffAt: p.keyOffAt, outcome: p.outcome,
      secondsIntoPurge: p.secondsIntoPurge, ambientC: p.ambientC, freezeExposure: p.freezeExposure, faultCount: faults });
  }

  const driver = async (code: string, name: string) => (await t.api.post('/api/drivers').set(auth).send({ code, name, depot: 'East' }).expect(201)).body.id as number;
  const amber = await driver('D-A', 'Driver Amber');
  const birch = await driver('D-B', 'Driver Birch');
  assignments = [
    { driverId: amber, driverName: 'Driver Amber', unitId: 'E-1', from: T0, to: T0 + 6 * H },
    { driverId: birch, driverName: 'Driver Birch', unitId: 'E-1', from: T0 + 6 * H, to: null },
    { driverId: birch, driverName: 'Driver Birch', unitId: 'E-2', from: T0 + 3 * H, to: T0 + 9 * H },
    { driverId: amber, driverName: 'Driver Amber', unitId: 'W-1', from: T0 - H, to: T0 + 4 * H },
  ];
  for (const a of assignments) {
    await t.api.post('/api/drivers/assignments').set(auth)
      .send({ driverId: a.driverId, unitId: a.unitId, from: new Date(a.from).toISOString(), to: a.to === null ? null : new Date(a.to).toISOString() }).expect(201);
  }
  rows = rows.map((r) => {
    const a = driverAt(r.unitId, r.keyOffAt);
    return { ...r, driverId: a?.driverId ?? null, driverName: a?.driverName ?? null };
  });
}, 60_000);
afterAll(async () => t?.stop());

const KEY: Record<EpisodeSort, (r: Ref) => string | number | null> = {
  keyOffAt: (r) => r.keyOffAt, unitId: (r) => r.unitId, depot: (r) => depotOf.get(r.unitId)!, driver: (r) => r.driverName, outcome: (r) => r.outcome,
  secondsIntoPurge: (r) => r.secondsIntoPurge, ambientC: (r) => r.ambientC, freezeExposure: (r) => r.freezeExposure,
};

/** The reference order: by the column, empty values last in either direction, then by id in the same direction. */
function expected(sort: EpisodeSort, dir: 'asc' | 'desc', keep: (r: Ref) => boolean) {
  const s = dir === 'asc' ? 1 : -1;
  return rows.filter(keep).sort((a, b) => {
    const [x, y] = [KEY[sort](a), KEY[sort](b)];
    if (x !== y) {
      if (x === null) return 1;
      if (y === null) return -1;
      return (x < y ? -1 : 1) * s;
    }
    return (a.id - b.id) * s;
  });
}

const view = (r: Ref) => ({
  id: r.id, unitId: r.unitId, depot: depotOf.get(r.unitId), driverId: r.driverId, driverName: r.driverName, keyOffAt: new Date(r.keyOffAt).toISOString(),
  outcome: r.outcome, secondsIntoPurge: r.secondsIntoPurge, ambientC: r.ambientC, freezeExposure: r.freezeExposure, faultCount: r.faultCount,
});
const seen = (r: HistoryEpisodeRow) => ({
  id: r.id, unitId: r.unitId, depot: r.depot, driverId: r.driverId, driverName: r.driverName, keyOffAt: r.keyOffAt,
  outcome: r.outcome, secondsIntoPurge: r.secondsIntoPurge, ambientC: r.ambientC, freezeExposure: r.freezeExposure, faultCount: r.faultCount,
});

/** Every page of a query, in page order, with the total each page reported. */
async function allPages(query: string, pageSize: number) {
  const out: HistoryEpisodeRow[] = [];
  const totals = new Set<number>();
  for (let page = 1; ; page++) {
    const { body } = await get(`/api/history/episodes?${query}&page=${page}&pageSize=${pageSize}`).expect(200);
    totals.add(body.total);
    out.push(...body.rows);
    if (body.rows.length < pageSize) return { rows: out, totals: [...totals] };
  }
}

const from = new Date(T0 + 2 * H).toISOString();
const to = new Date(T0 + 10 * H).toISOString();
const inRange = (r: Ref) => r.keyOffAt >= T0 + 2 * H && r.keyOffAt < T0 + 10 * H;

describe('history page order', () => {
  it('the default page (no sort given) is a depot\'s newest 50 in the range, then the rest on page 2', async () => {
    const want = expected('keyOffAt', 'desc', (r) => depotOf.get(r.unitId) === 'East');
    expect(want).toHaveLength(60);
    const p1 = (await get(`/api/history/episodes?depot=East&from=${new Date(T0).toISOString()}`).expect(200)).body;
    expect(p1).toMatchObject({ total: 60, totalCapped: false, page: 1, pageSize: 50 });
    expect(p1.rows.map(seen)).toEqual(want.slice(0, 50).map(view));
    const p2 = (await get(`/api/history/episodes?depot=East&from=${new Date(T0).toISOString()}&page=2`).expect(200)).body;
    expect(p2.rows.map(seen)).toEqual(want.slice(50).map(view));
    expect((await get('/api/history/episodes?depot=East&page=3').expect(200)).body.rows).toEqual([]);
  });

  for (const sort of EPISODE_SORTS) {
    for (const dir of ['asc', 'desc'] as const) {
      it(`sorted by ${sort} ${dir}: pages of 7 of a depot's range, and of the whole fleet, join up to the reference order without gap or overlap`, async () => {
        const depot = await allPages(`depot=East&from=${from}&to=${to}&sort=${sort}&dir=${dir}`, 7);
        const wantDepot = expected(sort, dir, (r) => depotOf.get(r.unitId) === 'East' && inRange(r));
        expect(depot.totals).toEqual([wantDepot.length]);
        expect(depot.rows.map(seen)).toEqual(wantDepot.map(view));
        const fleet = await allPages(`sort=${sort}&dir=${dir}`, 9);
        expect(fleet.rows.map(seen)).toEqual(expected(sort, dir, () => true).map(view));
      });
    }
  }

  it('a driver as the filter: only the episodes whose key-off an assignment of that driver covers, paged without overlap', async () => {
    const birch = assignments.find((a) => a.driverName === 'Driver Birch')!.driverId;
    const mine = (r: Ref) => r.driverId === birch;
    for (const [sort, dir] of [['keyOffAt', 'desc'], ['unitId', 'asc'], ['driver', 'asc'], ['secondsIntoPurge', 'desc']] as const) {
      const got = await allPages(`driverId=${birch}&sort=${sort}&dir=${dir}`, 4);
      const want = expected(sort, dir, mine);
      expect(want.length).toBe(6 + 6); // E-1 from 06:00 on, E-2 03:00 to 09:00
      expect(got.totals).toEqual([want.length]);
      expect(got.rows.map(seen)).toEqual(want.map(view));
    }
    const east = await allPages(`driverId=${birch}&depot=East&from=${from}&to=${to}`, 5);
    expect(east.rows.map(seen)).toEqual(expected('keyOffAt', 'desc', (r) => mine(r) && inRange(r)).map(view));
  });

  it('a unit moved to another depot shows its whole history under its new depot and none under the old one', async () => {
    await t.api.patch('/api/units/E-5').set('Authorization', `Bearer ${token}`).send({ depot: 'West' }).expect(200);
    depotOf.set('E-5', 'West');
    for (const depot of ['East', 'West']) {
      for (const [sort, dir] of [['keyOffAt', 'desc'], ['keyOffAt', 'asc'], ['depot', 'asc'], ['unitId', 'desc']] as const) {
        const got = await allPages(`depot=${depot}&sort=${sort}&dir=${dir}`, 10);
        const want = expected(sort, dir, (r) => depotOf.get(r.unitId) === depot);
        expect(want).toHaveLength(depot === 'East' ? 48 : 36);
        expect(got.rows.map(seen)).toEqual(want.map(view));
      }
    }
    const fleet = await allPages('sort=depot&dir=desc', 25);
    expect(fleet.rows.map(seen)).toEqual(expected('depot', 'desc', () => true).map(view));
    expect(fleet.rows.filter((r) => r.unitId === 'E-5').every((r) => r.depot === 'West')).toBe(true);
  });
});
