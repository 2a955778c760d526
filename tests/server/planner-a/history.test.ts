// Fleet history through the real service: filters, server-side paging and sorting, driver attribution, CSV export.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { startTestService, type TestService } from '../../helpers/service';
import { buildFleetWeek, D1_NAME, N1_NAME, W46, W47, W48 } from './fleet-week';

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

const iso = (ms: number) => new Date(ms).toISOString();

describe('history of episodes', () => {
  it('pages through a depot in key-off order with the total for the pager, pages never overlapping', async () => {
    const q = `depot=North&from=${iso(W46)}&to=${iso(W48)}&sort=keyOffAt&dir=asc&pageSize=3`;
    const pages = await Promise.all([1, 2, 3].map(async (p) => (await get(`/api/history/episodes?${q}&page=${p}`).expect(200)).body));
    expect(pages.map((p) => [p.total, p.page, p.pageSize, p.rows.length])).toEqual([[8, 1, 3, 3], [8, 2, 3, 3], [8, 3, 3, 2]]);
    const rows = pages.flatMap((p) => p.rows);
    expect(new Set(rows.map((r) => r.id)).size).toBe(8);
    const times = rows.map((r) => r.keyOffAt);
    expect(times).toEqual([...times].sort());
    expect(rows.every((r) => r.depot === 'North')).toBe(true);
    expect(rows[0]).toMatchObject({ unitId: 'N-1', unitName: N1_NAME, outcome: 'interrupted', secondsIntoPurge: 10, driverName: null });
  });

  it('each episode carries the driver whose assignment covers its key-off', async () => {
    const { body } = await get(`/api/history/episodes?unitId=N-1&from=${iso(W47)}&sort=keyOffAt&dir=asc`).expect(200);
    expect(body.rows.map((r: { driverName: string | null }) => r.driverName)).toEqual([D1_NAME, D1_NAME, 'Driver Two', 'Driver Two']);
    const byDriver = (await get(`/api/history/episodes?driverId=${ids.d2}`).expect(200)).body;
    expect(byDriver.total).toBe(4);
    expect(new Set(byDriver.rows.map((r: { unitId: string }) => r.unitId))).toEqual(new Set(['N-1', 'N-2']));
  });

  it('sorts interrupted purges by seconds into the purge, longest first, and filters by outcome', async () => {
    const { body } = await get('/api/history/episodes?outcome=interrupted&sort=secondsIntoPurge&dir=desc').expect(200);
    expect(body.rows.map((r: { secondsIntoPurge: number }) => r.secondsIntoPurge)).toEqual([90, 60, 38, 20, 10]);
    expect(body.rows.map((r: { freezeExposure: string }) => r.freezeExposure)).toEqual(['atRisk', 'frozen', 'none', 'none', 'none']);
    const completed = (await get('/api/history/episodes?outcome=completed&depot=South').expect(200)).body;
    expect(completed.rows.map((r: { unitId: string }) => r.unitId)).toEqual(['S-1']);
  });

  it('an interrupted purge followed by a fault at the next key-on counts that fault', async () => {
    const { body } = await get('/api/history/episodes?unitId=S-1&outcome=interrupted').expect(200);
    expect(body.rows[0]).toMatchObject({ secondsIntoPurge: 90, faultCount: 1 });
  });

  it('refuses a column not on the sort list, a page size over 500 and a range that ends before it starts', async () => {
    for (const q of ['sort=password', 'sort=key_off_at;drop', 'pageSize=501', 'page=0', `from=${iso(W48)}&to=${iso(W46)}`, 'outcome=sideways', 'driverId=abc']) {
      const res = await get(`/api/history/episodes?${q}`);
      expect(res.status, q).toBe(400);
      expect(res.body.error.code).toBe('validation_error');
    }
  });

  it('the contract routes stay as they were: GET /api/episodes is a plain array', async () => {
    const { body } = await get('/api/episodes?unitId=N-2').expect(200);
    expect(Array.isArray(body)).toBe(true);
    expect(body).toHaveLength(2);
    expect(body[0]).not.toHaveProperty('driverName');
  });
});

describe('history of faults', () => {
  it('lists faults explained by an interrupted purge with their unit, depot and driver', async () => {
    const { body } = await get('/api/history/faults?linked=yes&sort=unitId&dir=asc').expect(200);
    expect(body.total).toBe(2);
    expect(body.rows.map((r: object) => r)).toEqual([
      expect.objectContaining({ unitId: 'N-1', depot: 'North', driverName: 'Driver Two', spn: 520201, fmi: 18, episodeId: expect.any(Number) }),
      expect.objectContaining({ unitId: 'S-1', depot: 'South', driverName: null, spn: 520202, fmi: 5 }),
    ]);
    expect((await get('/api/history/faults?linked=no').expect(200)).body.total).toBe(0);
  });
});

describe('CSV export', () => {
  it('exports exactly the filtered rows, in the same order, parsed back by papaparse to the same values', async () => {
    const q = 'depot=North&sort=keyOffAt&dir=asc';
    const res = await get(`/api/history/episodes/export.csv?${q}`).buffer(true).parse((r, cb) => {
      let s = '';
      r.on('data', (c: Buffer) => (s += c.toString('utf8')));
      r.on('end', () => cb(null, s));
    });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/attachment; filename="episodes-.*\.csv"/);
    const text = res.body as string;
    // RFC 4180: a field with a comma or quote is quoted and its quotes doubled; CRLF ends each record.
    expect(text).toContain('"Tractor ""North"", 1"');
    // A text cell starting with = is prefixed with ' so a spreadsheet shows it instead of running it.
    expect(text).toContain(`"'=Driver ""One"", early"`);
    expect(text.split('\r\n')[0]).toBe('episode_id,unit_id,unit_name,depot,driver,key_off_at,purge_seconds,outcome,settled_by,ended_at,seconds_into_purge,ambient_c,min_ambient_after_c,freeze_exposure,linked_faults');
    const parsed = Papa.parse<Record<string, string>>(text.trim(), { header: true });
    expect(parsed.errors).toEqual([]);
    const api = (await get(`/api/history/episodes?${q}&pageSize=500`).expect(200)).body.rows;
    expect(parsed.data.map((r) => Number(r.episode_id))).toEqual(api.map((r: { id: number }) => r.id));
    expect(parsed.data.map((r) => r.outcome)).toEqual(api.map((r: { outcome: string }) => r.outcome));
    expect(parsed.data.map((r) => r.seconds_into_purge)).toEqual(api.map((r: { secondsIntoPurge: number | null }) => (r.secondsIntoPurge === null ? '' : String(r.secondsIntoPurge))));
    expect(parsed.data.map((r) => r.key_off_at)).toEqual(api.map((r: { keyOffAt: string }) => r.keyOffAt));
  });

  it('a filter that matches nothing exports the header alone; a bad filter is refused before any CSV is sent', async () => {
    const res = await get(`/api/history/faults/export.csv?unitId=S-1&from=${iso(W48)}`).expect(200);
    expect(res.text).toBe('fault_id,unit_id,unit_name,depot,driver,at,source_address,spn,fmi,fmi_text,occurrence_count,episode_id\r\n');
    const bad = await get('/api/history/episodes/export.csv?sort=nope');
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('validation_error');
  });
});
