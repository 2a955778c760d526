// When the live feed pushes: a unit that entered another state goes out at once (pushes kept a minimum gap
// apart), new readings wait for the coalescing window and ride along with the next push. A real http server, the feed and a real ws client;
// the ingest's announcements come from the real event emitter it uses.
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import pino from 'pino';
import { startLiveFeed } from '../../../server/realtime/live-feed';
import { createFleetEvents, type UnitChange } from '../../../server/ingest/fleet-events';
import type { LiveUnitView } from '../../../server/lib/context';
import type { UnitState } from '../../../server/detection/types';
import { openLive, type LiveClient } from '../../helpers/live-client';

const events = createFleetEvents();
const views = new Map<string, LiveUnitView>();
let http: Server;
let feed: ReturnType<typeof startLiveFeed>;
let board: LiveClient;

const view = (state: string | null, supplyV: number): LiveUnitView => ({
  state, stateSince: '2026-12-02T10:00:00.000Z', purgeRemainingS: state === 'purging' ? 120 : null, lastSupplyV: supplyV, lastAmbientC: -6, lastSeenAt: '2026-12-02T10:00:05.000Z',
});
const st = (state: UnitState['state']): UnitState => ({ state, since: Date.UTC(2026, 11, 2, 10), purgeRemainingS: state === 'purging' ? 120 : null });

function announce(unitId: string, previous: UnitState | null, state: UnitState | null, supplyV: number) {
  views.set(unitId, view(state?.state ?? null, supplyV));
  const change: UnitChange = { unitId, depot: 'North', view: views.get(unitId)!, previous, state };
  events.emit('units', [change]);
}

const unitsMessages = () => board.messages.filter((m) => m.type === 'units');

beforeAll(async () => {
  http = createServer();
  await new Promise<void>((res) => http.listen(0, '127.0.0.1', res));
  feed = startLiveFeed({
    http, events, log: pino({ level: 'silent' }),
    verifyUser: async (token) => { if (token !== 'ok') throw new Error('bad token'); return {}; },
    switchUnit: async () => null,
    view: (id) => views.get(id) ?? view(null, 0),
    depotOf: () => 'North',
    // Long enough that a push within it can only be the immediate one.
    coalesceMs: 1500,
    minGapMs: 300,
  });
  board = await openLive(`ws://127.0.0.1:${(http.address() as AddressInfo).port}/api/live?token=ok`);
  await board.waitFor((m) => m.type === 'hello');
});
afterAll(async () => {
  board?.close();
  feed?.close();
  await new Promise((res) => http?.close(res));
});

describe('live feed pushes', () => {
  it('new readings wait for the coalescing window; a state change goes at once and takes them along', async () => {
    const t0 = Date.now();
    announce('LF-1', st('keyOn'), st('keyOn'), 13.9); // a reading, same state
    announce('LF-2', st('keyOn'), st('keyOn'), 13.8);
    await new Promise((r) => setTimeout(r, 300));
    expect(unitsMessages()).toHaveLength(0);

    announce('LF-3', st('keyOn'), st('purging'), 12.6); // key-off: purging
    const pushed = await board.waitFor((m) => m.type === 'units', 1000);
    expect(Date.now() - t0).toBeLessThan(1500); // before the window would have ended
    expect(pushed.type === 'units' && pushed.units.map((u) => u.id).sort()).toEqual(['LF-1', 'LF-2', 'LF-3']);
    expect(pushed.type === 'units' && pushed.units.find((u) => u.id === 'LF-3')).toMatchObject({ state: 'purging', purgeRemainingS: 120, lastSupplyV: 12.6 });
  });

  it('a unit seen for the first time counts as a change of state', async () => {
    const before = unitsMessages().length;
    announce('LF-4', null, st('keyOn'), 13.9);
    const pushed = await board.waitFor((m) => m.type === 'units' && m.units.some((u) => u.id === 'LF-4'), 1000);
    expect(unitsMessages().length).toBe(before + 1);
    expect(pushed.type === 'units' && pushed.units).toHaveLength(1);
  });

  it('state changes close together: the second waits for the gap after the last push, not for the window', async () => {
    announce('LF-6', st('keyOn'), st('purging'), 12.6);
    await board.waitFor((m) => m.type === 'units' && m.units.some((u) => u.id === 'LF-6'), 1000);
    const first = Date.now();
    announce('LF-7', st('purging'), st('interrupted'), 1.2); // supply lost
    await board.waitFor((m) => m.type === 'units' && m.units.some((u) => u.id === 'LF-7' && u.state === 'interrupted'), 1000);
    const waited = Date.now() - first;
    expect(waited).toBeGreaterThanOrEqual(250);
    expect(waited).toBeLessThan(1200);
  });

  it('a reading alone is pushed when the window ends', async () => {
    const t0 = Date.now();
    announce('LF-5', st('safeToIsolate'), st('safeToIsolate'), 12.4);
    const pushed = await board.waitFor((m) => m.type === 'units' && m.units.some((u) => u.id === 'LF-5'), 4000);
    expect(Date.now() - t0).toBeGreaterThanOrEqual(1400);
    expect(pushed.type === 'units' && pushed.units.find((u) => u.id === 'LF-5')).toMatchObject({ state: 'safeToIsolate', lastSupplyV: 12.4 });
  });
});
