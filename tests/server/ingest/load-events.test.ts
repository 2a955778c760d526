// A unit's messages read back in position order through the primary key, gateway by gateway, against a
// reference computed here from the same rows: protocol v1 orders a gateway's messages by (boot, seq), a unit's
// later gateway is a later stream, and of copies at one position the first received wins.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connectDb, type Db } from '../../../server/db/index';
import { loadBootEvents, loadEvents } from '../../../server/ingest/episode-store';
import { createTestDatabase } from '../../helpers/test-db';

interface Row { gw: string; stream: number; boot: number; seq: number; kind: 'telemetry' | 'can' | 'power'; ts: string; receivedAt: number; supplyV: number }

let db: Db;
let drop: () => Promise<void>;
const rows: Row[] = [];
const UNIT = 'LE-1';

beforeAll(async () => {
  const t = await createTestDatabase();
  drop = t.drop;
  db = await connectDb(t.url);
  const q = (sql: string, bind: unknown[] = []) => db.sequelize.query(sql, { bind });
  for (const unit of [UNIT, 'LE-OTHER']) {
    await q(`INSERT INTO units (id, name, depot, system_voltage, purge_seconds, loss_threshold_v, created_at, updated_at) VALUES ($1, $1, 'D', 12, 120, 6, now(), now())`, [unit]);
  }
  // The unit's first gateway (stream 0, boots 3 and 4), its replacement (stream 1, boot 0), and another unit's gateway.
  for (const [gw, unit, stream] of [['LE-GW-A', UNIT, 0], ['LE-GW-B', UNIT, 1], ['LE-GW-X', 'LE-OTHER', 0]] as const) {
    await q(`INSERT INTO gateways (gateway_id, unit_id, secret_hash, stream, created_at, updated_at) VALUES ($1, $2, 'x', $3, now(), now())`, [gw, unit, stream]);
  }
  let n = 0;
  const add = (gw: string, stream: number, boot: number, seq: number, kind: Row['kind'] = 'telemetry', tsOffset = 0) => {
    const ts = new Date(Date.UTC(2026, 10, 27, 17, 0, 0) + (boot * 1000 + seq) * 5000 + tsOffset).toISOString();
    rows.push({ gw, stream, boot, seq, kind, ts, receivedAt: Date.UTC(2026, 10, 30) + n++ * 10, supplyV: 12 + n / 1000 });
  };
  for (let s = 0; s < 40; s++) add('LE-GW-A', 0, 3, s, s % 7 === 0 ? 'can' : 'telemetry');
  for (let s = 0; s < 25; s++) add('LE-GW-A', 0, 4, s, s === 0 ? 'power' : 'telemetry');
  for (let s = 0; s < 30; s++) add('LE-GW-B', 1, 0, s);
  for (let s = 0; s < 30; s++) add('LE-GW-X', 0, 3, s);
  // Copies at one position with another ts (a gateway that stamped a resend anew): received later, so they lose.
  add('LE-GW-A', 0, 3, 20, 'telemetry', 7);
  add('LE-GW-B', 1, 0, 5, 'telemetry', 9);
  for (const r of [...rows].reverse()) {
    await q(
      `INSERT INTO messages (gateway_id, boot, seq, unit_id, stream, kind, ts, payload, received_at) VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9)`,
      [r.gw, r.boot, r.seq, r.gw === 'LE-GW-X' ? 'LE-OTHER' : UNIT, r.stream, r.kind,
        r.ts, JSON.stringify(r.kind === 'telemetry' ? { boot: r.boot, seq: r.seq, ts: r.ts, key: 'on', supplyV: r.supplyV, ambientC: null, ecmAwake: true } : r.kind === 'power' ? { boot: r.boot, seq: r.seq, ts: r.ts, event: 'boot', supplyV: r.supplyV, prevShutdown: null } : { boot: r.boot, seq: r.seq, ts: r.ts, frames: [] }),
        new Date(r.receivedAt).toISOString()],
    );
  }
});
afterAll(async () => {
  await db?.close();
  await drop?.();
});

/** The reference: the unit's rows by (stream, boot, seq, received_at), as the ingest has always read them. */
const unitRows = (kinds = ['telemetry', 'power', 'can']) =>
  rows.filter((r) => r.gw !== 'LE-GW-X' && kinds.includes(r.kind)).sort((a, b) => a.stream - b.stream || a.boot - b.boot || a.seq - b.seq || a.receivedAt - b.receivedAt);
/** The last `n` before a position, newest position first and, at one position, the first received first (so a tail cut between copies keeps the winner). */
const lastBefore = (list: Row[], n: number) => {
  const newestFirst = [...list].sort((a, b) => b.stream - a.stream || b.boot - a.boot || b.seq - a.seq || a.receivedAt - b.receivedAt).slice(0, n);
  return list.filter((r) => newestFirst.includes(r));
};
const key = (e: { stream: number; boot: number; seq: number; ts: number }) => `${e.stream}/${e.boot}/${e.seq}@${e.ts}`;
const refKey = (r: Row) => `${r.stream}/${r.boot}/${r.seq}@${Date.parse(r.ts)}`;
const cmp = (r: Row, p: { stream: number; boot: number; seq: number }) => r.stream - p.stream || r.boot - p.boot || r.seq - p.seq;

describe('a unit\'s messages in position order, through the primary key', () => {
  const positions = [
    { stream: 0, boot: 3, seq: 0 }, { stream: 0, boot: 3, seq: 20 }, { stream: 0, boot: 4, seq: 0 }, { stream: 0, boot: 4, seq: 24 },
    { stream: 1, boot: 0, seq: 0 }, { stream: 1, boot: 0, seq: 5 }, { stream: 1, boot: 0, seq: 29 }, { stream: 1, boot: 0, seq: 99 }, { stream: 2, boot: 0, seq: 0 },
  ];

  it('from a position on: every later message of the unit, over both its gateways, none of another unit', async () => {
    for (const from of positions) {
      const got = (await loadEvents(db.sequelize, UNIT, { from })).map((r) => key(r.event));
      expect(got, JSON.stringify(from)).toEqual(unitRows().filter((r) => cmp(r, from) >= 0).map(refKey));
    }
  });

  it('the last few before a position, and the last of all without one, copies in the order received', async () => {
    for (const from of positions) {
      for (const tail of [1, 3, 20]) {
        const got = (await loadEvents(db.sequelize, UNIT, { from, beforeTail: tail })).map((r) => key(r.event));
        expect(got, `${JSON.stringify(from)} tail ${tail}`).toEqual(lastBefore(unitRows().filter((r) => cmp(r, from) < 0), tail).map(refKey));
      }
    }
    const last = (await loadEvents(db.sequelize, UNIT, { beforeTail: 20 })).map((r) => key(r.event));
    expect(last).toEqual(lastBefore(unitRows(), 20).map(refKey));
  });

  it('one kind over the unit\'s whole history, and one boot with the next (its boot record)', async () => {
    expect((await loadEvents(db.sequelize, UNIT, { kinds: ['can'] })).map((r) => key(r.event))).toEqual(unitRows(['can']).map(refKey));
    const boot3 = (await loadBootEvents(db.sequelize, UNIT, 0, 3)).map((r) => key(r.event));
    expect(boot3).toEqual(unitRows().filter((r) => r.stream === 0 && (r.boot === 3 || r.boot === 4)).map(refKey));
    // The first received copy comes first at its position (the judgement keeps the first of a position).
    const at20 = boot3.filter((k) => k.startsWith('0/3/20@'));
    expect(at20).toHaveLength(2);
    expect(at20[0]).toBe(refKey(rows.find((r) => r.gw === 'LE-GW-A' && r.seq === 20 && r.boot === 3)!));
  });
});
