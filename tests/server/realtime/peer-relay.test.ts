// The relay between workers over a real PostgreSQL LISTEN/NOTIFY: three workers' relays in one process,
// each beside a real unit book, on a driven wall clock (so the countdown is checked without waiting).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import pino from 'pino';
import pg from 'pg';
import { connectDb, type Db } from '../../../server/db/index';
import { createTestDatabase } from '../../helpers/test-db';
import { UnitBook } from '../../../server/ingest/unit-book';
import { newMemory, type UnitProfile } from '../../../server/ingest/unit-memory';
import { createFleetEvents, type FleetEvents } from '../../../server/ingest/fleet-events';
import { startPeerRelay, type PeerRelay } from '../../../server/realtime/peer-relay';
import type { Episode, UnitState } from '../../../server/detection/types';
import { getAlert } from '../../../server/modules/alerts/service';
import type { AlertView } from '../../../shared/realtime/envelope';
import { until } from '../../helpers/until';

const log = pino({ level: 'silent' });
const T = Date.UTC(2026, 11, 1, 17, 0, 0);
let wall = T;
let db: Db;
let dbUrl: string;
let drop: () => Promise<void>;
interface Worker { book: UnitBook; events: FleetEvents; relay: PeerRelay; heard: { units: string[][]; episodes: string[][]; alerts: AlertView[]; resyncs: number } }
const workers: Record<'a' | 'b' | 'c', Worker> = {} as never;

const profile = (unitId: string, depot = 'North yard'): UnitProfile => ({ unitId, depot, purgeSeconds: 120, lossThresholdV: 11.5, linkSpns: null });
const pending = (keyOffTs: number): Episode => ({
  keyOff: { stream: 0, boot: 1, seq: 7, ts: keyOffTs }, purgeSeconds: 120, lossThresholdV: 11.5, outcome: 'pending', settledBy: null, endedAt: null,
  secondsIntoPurge: null, ambientC: -4, evidence: null, final: false, minAmbientAfterC: null, freezeExposure: null, nextKeyOnAt: null,
});

/** Puts a judgement of the unit in a worker's book, as the ingest does after a commit, and announces it. */
function judge(k: keyof typeof workers, unitId: string, version: number, state: UnitState, opts: { episode?: Episode; depot?: string; announce?: boolean } = {}) {
  const { book, events } = workers[k];
  const m = newMemory(profile(unitId, opts.depot), wall);
  m.version = version;
  m.state = state;
  m.lastTs = wall - 500;
  m.lastArrival = wall - 500;
  m.lastTelemetry = { position: { stream: 0, boot: 1, seq: 8 }, supplyV: 12.6, ambientC: -4 };
  if (opts.episode) m.episodes.set('k', { id: 1, episode: opts.episode });
  const previous = book.peek(unitId)?.state ?? null;
  book.set(unitId, m);
  if (opts.announce !== false) events.emit('units', [{ unitId, depot: m.profile.depot, view: book.view(unitId), previous, state }]);
}

const heard = (k: keyof typeof workers, kind: 'units' | 'episodes', unitId: string) =>
  new Promise<void>((res, rej) => {
    const timer = setTimeout(() => rej(new Error(`${k} did not hear ${kind} of ${unitId}`)), 5000);
    const check = () => (workers[k].heard[kind].some((ids) => ids.includes(unitId)) ? (clearTimeout(timer), res()) : setTimeout(check, 5));
    check();
  });
const received = async (k: keyof typeof workers, atLeast: number) => {
  for (let i = 0; i < 1000 && workers[k].relay.counters.notificationsReceived < atLeast; i++) await new Promise((r) => setTimeout(r, 5));
  expect(workers[k].relay.counters.notificationsReceived).toBeGreaterThanOrEqual(atLeast);
};

beforeAll(async () => {
  const t = await createTestDatabase();
  drop = t.drop;
  dbUrl = t.url;
  db = await connectDb(t.url, { poolMax: 2 });
  for (const k of ['a', 'b', 'c'] as const) {
    const book = new UnitBook(db.sequelize, () => wall, log);
    const events = createFleetEvents();
    const relay = await startPeerRelay({ databaseUrl: t.url, workerId: k, events, book, loadAlert: (id) => getAlert(db.sequelize, id), log, wallNow: () => wall, retryMs: 50 });
    const w: Worker = { book, events, relay, heard: { units: [], episodes: [], alerts: [], resyncs: 0 } };
    relay.peers.on('units', (ids) => w.heard.units.push(ids));
    relay.peers.on('episodes', (ids) => w.heard.episodes.push(ids));
    relay.peers.on('alert', (a) => w.heard.alerts.push(a));
    relay.peers.on('resync', () => w.heard.resyncs++);
    workers[k] = w;
  }
});
afterAll(async () => {
  for (const w of Object.values(workers)) await w.relay.close();
  await db?.close();
  await drop?.();
});

describe('relay between workers', () => {
  it('a worker answers from the newer judgement: the relayed one over its stale memory, then its own newer one', async () => {
    const { a, b } = workers;
    judge('a', 'U-1', 3, { state: 'keyOn', since: T - 60_000, purgeRemainingS: null }, { announce: false });
    expect(a.relay.view('U-1').state).toBe('keyOn');
    // Worker b judges the key-off (version 4); 109.6 s of the purge are left at T.
    judge('b', 'U-1', 4, { state: 'purging', since: T - 10_400, purgeRemainingS: 110 }, { episode: pending(T - 10_400), depot: 'South yard' });
    await heard('a', 'units', 'U-1');
    expect(a.relay.view('U-1')).toEqual({ ...b.relay.view('U-1'), purgeRemainingS: 110 });
    expect(a.relay.view('U-1')).toMatchObject({ state: 'purging', stateSince: new Date(T - 10_400).toISOString(), lastSupplyV: 12.6, lastAmbientC: -4 });
    expect(a.relay.depotOf('U-1')).toBe('South yard');
    // The countdown runs on this worker's clock to the same second as the judging worker's (PostgreSQL
    // delivers within the same driven instant here, so the two must agree exactly).
    for (const step of [600, 50_000, 59_000, 400, 5000]) {
      wall += step;
      expect(a.relay.view('U-1').purgeRemainingS).toBe(b.relay.view('U-1').purgeRemainingS);
    }
    expect(a.relay.view('U-1').purgeRemainingS).toBe(0);
    // Worker a then judges the unit itself (version 5): its own memory is the newer again, and b takes it.
    judge('a', 'U-1', 5, { state: 'safeToIsolate', since: wall - 1000, purgeRemainingS: null });
    expect(a.relay.view('U-1').state).toBe('safeToIsolate');
    expect(a.relay.depotOf('U-1')).toBe('North yard');
    await heard('b', 'units', 'U-1');
    expect(b.relay.view('U-1').state).toBe('safeToIsolate');
  });

  it('an older judgement relayed late changes nothing, and a worker ignores its own notifications', async () => {
    const { a, b } = workers;
    const bOlder = b.relay.counters.unitsOlder;
    const bReceived = b.relay.counters.notificationsReceived;
    judge('b', 'U-2', 8, { state: 'interrupted', since: wall - 2000, purgeRemainingS: null });
    await heard('a', 'units', 'U-2');
    const receivedBefore = a.relay.counters.notificationsReceived;
    const olderBefore = a.relay.counters.unitsOlder;
    const heardBefore = a.heard.units.length;
    // Worker c held an earlier judgement (version 7) and announces it only now.
    judge('c', 'U-2', 7, { state: 'purging', since: wall - 30_000, purgeRemainingS: 90 }, { episode: pending(wall - 30_000) });
    await received('a', receivedBefore + 1);
    expect(a.relay.counters.unitsOlder).toBe(olderBefore + 1);
    expect(a.heard.units.length).toBe(heardBefore);
    expect(a.relay.view('U-2').state).toBe('interrupted');
    // b heard its own notification and c's: only c's was weighed (and found older), not b's own.
    await received('b', bReceived + 2);
    expect(b.relay.counters.unitsOlder).toBe(bOlder + 1);
    expect(b.relay.view('U-2').state).toBe('interrupted');
    expect(b.heard.units.some((ids) => ids.includes('U-2'))).toBe(false);
  });

  it('tells which units\' episodes changed, and a fleet-wide batch crosses in several notifications', async () => {
    const { a, b } = workers;
    b.events.emit('episodes', [{ unitId: 'U-1', id: 1, episode: pending(T), before: null }]);
    await heard('a', 'episodes', 'U-1');
    const before = a.relay.counters.unitsAccepted;
    const receivedBefore = a.relay.counters.notificationsReceived;
    // 600 units with long depot names: far more than one 8000-byte notification (PostgreSQL refuses a longer payload).
    const ids = Array.from({ length: 600 }, (_, i) => `F-${i}`);
    const { book, events } = b;
    for (const id of ids) {
      const m = newMemory(profile(id, `Depot ${'x'.repeat(110)}`), wall);
      m.version = 1;
      m.state = { state: 'keyOn', since: wall, purgeRemainingS: null };
      book.set(id, m);
    }
    events.emit('units', ids.map((unitId) => ({ unitId, depot: book.peek(unitId)!.profile.depot, view: book.view(unitId), previous: null, state: book.peek(unitId)!.state })));
    for (let i = 0; i < 1000 && a.relay.counters.unitsAccepted < before + 600; i++) await new Promise((r) => setTimeout(r, 5));
    expect(a.relay.counters.unitsAccepted).toBe(before + 600);
    expect(a.relay.counters.notificationsReceived - receivedBefore).toBeGreaterThan(5);
    expect(a.relay.view('F-599')).toMatchObject({ state: 'keyOn' });
    expect(b.relay.counters.sendErrors).toBe(0);
  });
});

const alert = (id: number, over: Partial<AlertView> = {}): AlertView => ({
  id, unitId: 'U-1', depot: 'North yard', kind: 'interruptedPurge', status: 'open', raisedAt: new Date(T).toISOString(), episodeId: null,
  secondsIntoPurge: 38, ambientC: -14, minAmbientAfterC: null, freezeExposure: 'frozen', escalatedAt: null, acknowledgedAt: null,
  acknowledgedBy: null, resolvedAt: null, resolvedBy: null, comment: null, ...over,
});
const alertsHeard = (k: keyof typeof workers, id: number) => workers[k].heard.alerts.filter((a) => a.id === id).map((a) => a.status);
const settle = () => new Promise((r) => setTimeout(r, 300));

describe('alerts relayed between workers', () => {
  it('an alert one worker pushed reaches the other workers\' feeds once, and so does each later stage; none comes back to its sender', async () => {
    const { a, b, c } = workers;
    const aReceived = a.relay.counters.notificationsReceived;
    a.relay.relayAlert(alert(101));
    await until(() => alertsHeard('b', 101).length && alertsHeard('c', 101).length);
    // Worker b's board acknowledges it through b's API: b's feed pushed it, a's and c's hear it from b.
    const acked = alert(101, { status: 'acknowledged', acknowledgedAt: new Date(T + 60_000).toISOString(), acknowledgedBy: 'monitor@test.local', comment: 'Driver called back' });
    b.relay.relayAlert(acked);
    await until(() => alertsHeard('a', 101).length && alertsHeard('c', 101).length === 2);
    expect(c.heard.alerts.filter((x) => x.id === 101)).toEqual([alert(101), acked]);
    // The raise reached worker a again (its own notification) and was not weighed.
    await received('a', aReceived + 2);
    // A late or repeated state is dropped: c relays the open alert again after the acknowledgement.
    const olderBefore = a.relay.counters.alertsOlder + b.relay.counters.alertsOlder;
    c.relay.relayAlert(alert(101));
    a.relay.relayAlert(acked);
    await until(() => a.relay.counters.alertsOlder + b.relay.counters.alertsOlder >= olderBefore + 3);
    await settle();
    expect(alertsHeard('a', 101)).toEqual(['acknowledged']);
    expect(alertsHeard('b', 101)).toEqual(['open']);
    expect(alertsHeard('c', 101)).toEqual(['open', 'acknowledged']);
  });

  it('an alert too large for a notification is read from the database by id, without holding up the others', async () => {
    const { a, b } = workers;
    await db.sequelize.query(`INSERT INTO units (id, name, depot, system_voltage, purge_seconds, loss_threshold_v, created_at, updated_at) VALUES ('AL-9', 'Tractor 9', 'North yard', 12, 120, 11.5, now(), now())`);
    // A comment of 2000 characters (the API's limit), four bytes each in UTF-8: far over PostgreSQL's 8000-byte payload.
    const [[row]] = (await db.sequelize.query(`INSERT INTO alerts (unit_id, kind, status, comment) VALUES ('AL-9', 'contactLost', 'acknowledged', $1) RETURNING id`, { bind: ['\u{1F50B}'.repeat(2000)] })) as [{ id: string }[], unknown];
    const big = await getAlert(db.sequelize, Number(row.id));
    const loadedBefore = b.relay.counters.alertsLoaded;
    const errorsBefore = b.relay.counters.alertLoadErrors;
    // One that is gone from the database by the time it is read is logged and skipped; the next still arrives.
    a.relay.relayAlert(alert(201));
    a.relay.relayAlert(big);
    a.relay.relayAlert({ ...big, id: 999_999 });
    a.relay.relayAlert(alert(202));
    await until(() => alertsHeard('b', 202).length);
    await until(() => b.relay.counters.alertLoadErrors > errorsBefore);
    expect(b.heard.alerts.filter((x) => [201, big.id, 202].includes(x.id)).map((x) => x.id)).toEqual([201, 202, big.id]);
    expect(b.heard.alerts.find((x) => x.id === big.id)).toEqual(big);
    expect(b.relay.counters.alertsLoaded).toBe(loadedBefore + 1);
    expect(b.relay.counters.alertLoadErrors).toBe(errorsBefore + 1);
  });

  it('alerts published while the relay connection was down go out once it is back, and its boards are told to re-read', async () => {
    const { a, b } = workers;
    const admin = new pg.Client({ connectionString: dbUrl });
    await admin.connect();
    const resyncs = a.heard.resyncs;
    const connects = a.relay.counters.connects;
    // Worker a's relay connection is cut again each time it comes back, until the alert below is published.
    let cutting = true;
    const cut = (async () => {
      while (cutting) {
        await admin.query(`SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE application_name = 'afterwatch-relay-a' AND datname = current_database()`);
        await new Promise((r) => setTimeout(r, 10));
      }
    })();
    await until(() => !a.relay.connected());
    a.relay.relayAlert(alert(301));
    cutting = false;
    await cut;
    await admin.end();
    await until(() => alertsHeard('b', 301).length, 10_000);
    expect(a.relay.counters.connects).toBeGreaterThan(connects);
    // Worker a could not hear the others meanwhile: its boards get a re-read notice (alerts are in the database).
    await until(() => a.heard.resyncs > resyncs);
    expect(b.heard.resyncs).toBe(0);
    await settle();
    expect(alertsHeard('b', 301)).toEqual(['open']);
    expect(alertsHeard('c', 301)).toEqual(['open']);
  });
});
