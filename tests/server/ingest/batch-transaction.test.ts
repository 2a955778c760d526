// The batch's transaction sends its BEGIN in front of the COPY (one simple query, one round trip fewer):
// checked against a real PostgreSQL that the rows are still all-or-nothing with what follows them, that a
// COPY meeting a stored copy aborts the whole batch (and the de-duplicating pass then stores only the new
// ones), and that a batch without messages is a transaction too. PostgreSQL's protocol documentation
// (frontend/backend protocol, "Multiple Statements in a Simple Query" and "COPY Operations") allows a COPY
// among several statements of one query; that is what is relied on here.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { connectDb, type Db } from '../../../server/db/index';
import { CopyInBatch, inBatchTransaction, insertMessages, type BatchTransaction } from '../../../server/ingest/store';
import type { MessageItem } from '../../../server/ingest/items';
import { createTestDatabase } from '../../helpers/test-db';

let db: Db;
let drop: () => Promise<void>;
const GW = 'BT-GW';
const UNIT = 'BT-1';

beforeAll(async () => {
  const t = await createTestDatabase();
  drop = t.drop;
  db = await connectDb(t.url);
  const q = (sql: string, bind: unknown[] = []) => db.sequelize.query(sql, { bind });
  await q(`INSERT INTO units (id, name, depot, system_voltage, purge_seconds, loss_threshold_v, created_at, updated_at) VALUES ($1, $1, 'D', 12, 120, 6, now(), now())`, [UNIT]);
  await q(`INSERT INTO gateways (gateway_id, unit_id, secret_hash, stream, created_at, updated_at) VALUES ($1, $2, 'x', 0, now(), now())`, [GW, UNIT]);
});
afterAll(async () => {
  await db?.close();
  await drop?.();
});

function item(boot: number, seq: number): MessageItem {
  const ts = Date.UTC(2026, 10, 27, 17, 0, 0) + seq * 5000;
  const payload = { boot, seq, ts: new Date(ts).toISOString(), key: 'on', supplyV: 13.8, ambientC: -3, ecmAwake: true };
  return {
    type: 'message', gatewayId: GW, unitId: UNIT, stream: 0, boot, seq, ts, kind: 'telemetry', payload,
    event: { kind: 'telemetry', stream: 0, boot, seq, ts, key: 'on', supplyV: 13.8, ambientC: -3, ecmAwake: true } as MessageItem['event'],
    frames: null, receivedAt: ts + 40,
  };
}

const stored = async (boot: number) =>
  (await db.sequelize.query<{ seq: string }>(`SELECT seq FROM messages WHERE gateway_id = $1 AND boot = $2 ORDER BY seq`, { bind: [GW, boot], type: QueryTypes.SELECT })).map((r) => Number(r.seq));

describe('the batch transaction (BEGIN sent with the COPY)', () => {
  it('commits the copied rows with the statements after them', async () => {
    const out = await inBatchTransaction(db.sequelize, async (t) => {
      const fresh = await insertMessages(t, [item(1, 0), item(1, 1), item(1, 2)]);
      const [{ n }] = await db.sequelize.query<{ n: string }>(`SELECT count(*) AS n FROM messages WHERE gateway_id = $1 AND boot = 1`, { bind: [GW], type: QueryTypes.SELECT, transaction: t });
      return { fresh, seenInside: Number(n) };
    });
    expect(out.fresh).toEqual({ all: true, size: 3 });
    expect(out.seenInside).toBe(3);
    expect(await stored(1)).toEqual([0, 1, 2]);
  });

  it('rolls the copied rows back when a later statement of the batch fails (the COPY did not commit on its own)', async () => {
    await expect(
      inBatchTransaction(db.sequelize, async (t) => {
        await insertMessages(t, [item(2, 0), item(2, 1)]);
        await db.sequelize.query(`SELECT 1 / 0`, { transaction: t });
      }),
    ).rejects.toThrow(/division by zero/);
    expect(await stored(2)).toEqual([]);
    // The connection went back to the pool in a usable state.
    const [{ one }] = await db.sequelize.query<{ one: number }>(`SELECT 1 AS one`, { type: QueryTypes.SELECT });
    expect(one).toBe(1);
  });

  it('a COPY meeting a stored copy aborts the batch; written again with copies told apart, only the new rows are stored', async () => {
    const batch = [item(3, 0), item(1, 1), item(3, 1)]; // (1, 1) is stored already
    await expect(inBatchTransaction(db.sequelize, (t) => insertMessages(t, batch))).rejects.toBeInstanceOf(CopyInBatch);
    expect(await stored(3)).toEqual([]);
    const fresh = await inBatchTransaction(db.sequelize, (t) => insertMessages(t, batch, true));
    expect(fresh.all).toBe(false);
    expect(fresh.size).toBe(2);
    expect(fresh.all === false && [...fresh.keys].sort()).toEqual([`${GW}|3|0`, `${GW}|3|1`]);
    expect(await stored(3)).toEqual([0, 1]);
    expect(await stored(1)).toEqual([0, 1, 2]);
  });

  it('a batch without messages is a transaction all the same: its writes commit together or not at all', async () => {
    const q = (sql: string, t: BatchTransaction) => db.sequelize.query(sql, { transaction: t });
    await inBatchTransaction(db.sequelize, async (t) => {
      await insertMessages(t, []);
      await t.open();
      await q(`UPDATE units SET name = 'first' WHERE id = '${UNIT}'`, t);
    });
    await expect(
      inBatchTransaction(db.sequelize, async (t) => {
        await t.open();
        await q(`UPDATE units SET name = 'second' WHERE id = '${UNIT}'`, t);
        await q(`SELECT 1 / 0`, t);
      }),
    ).rejects.toThrow(/division by zero/);
    const [{ name }] = await db.sequelize.query<{ name: string }>(`SELECT name FROM units WHERE id = $1`, { bind: [UNIT], type: QueryTypes.SELECT });
    expect(name).toBe('first');
  });
});
