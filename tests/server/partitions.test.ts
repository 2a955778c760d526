import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { connectDb, type Db } from '../../server/db/index';
import { maintainPartitions, plannedPartitions } from '../../server/db/partitions';
import { createTestDatabase } from '../helpers/test-db';

describe('monthly partitions of the raw history', () => {
  it('plans every month from now − retention to two months ahead', () => {
    const plan = plannedPartitions(new Date('2026-12-02T01:00:00Z'), 62);
    expect(plan.map((p) => p.name)).toEqual(['messages_202610', 'messages_202611', 'messages_202612', 'messages_202701', 'messages_202702']);
    expect(plan[1]).toMatchObject({ from: new Date('2026-11-01T00:00:00Z'), to: new Date('2026-12-01T00:00:00Z') });
  });

  let db: Db;
  let drop: () => Promise<void>;
  beforeAll(async () => {
    const t = await createTestDatabase();
    drop = t.drop;
    db = await connectDb(t.url);
  });
  afterAll(async () => {
    await db?.close();
    await drop?.();
  });

  const count = async (table: string) => Number((await db.sequelize.query<{ n: string }>(`SELECT count(*) n FROM ${table}`, { type: QueryTypes.SELECT }))[0].n);
  const insert = (ts: string, seq: number) =>
    db.sequelize.query(`INSERT INTO messages (gateway_id, boot, seq, unit_id, stream, kind, ts, payload) VALUES ('gw', 0, $1, 'P-1', 0, 'telemetry', $2, '{}')`, { bind: [seq, ts] });

  it('moves rows that were waiting in the default partition into their month, and drops months past the retention', async () => {
    await db.sequelize.query(`INSERT INTO units (id, name, depot, system_voltage, purge_seconds, loss_threshold_v, created_at, updated_at) VALUES ('P-1', 'P', 'D', 12, 120, 6, now(), now())`);
    await insert('2026-11-27T17:00:00.000Z', 1);
    await insert('2025-01-05T00:00:00.000Z', 2); // far older than the retention
    expect(await count('messages_default')).toBe(2);
    const r = await maintainPartitions(db.sequelize, { now: new Date('2026-12-02T01:00:00Z'), retentionDays: 62 });
    expect(r.created).toBe(5);
    expect(await count('messages_202611')).toBe(1);
    expect(await count('messages_default')).toBe(0);
    // A redelivered copy still conflicts on the primary key, now inside its partition.
    await db.sequelize.query(`INSERT INTO messages (gateway_id, boot, seq, unit_id, stream, kind, ts, payload) VALUES ('gw', 0, 1, 'P-1', 0, 'telemetry', '2026-11-27T17:00:00.000Z', '{}') ON CONFLICT DO NOTHING`);
    expect(await count('messages')).toBe(1);
    // Three months later with the same retention, October and November go.
    const later = await maintainPartitions(db.sequelize, { now: new Date('2027-02-02T01:00:00Z'), retentionDays: 62 });
    expect(later.dropped).toBe(2);
    expect(await count('messages')).toBe(0);
  });
});
