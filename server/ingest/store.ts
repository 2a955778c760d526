// The hot path's SQL: one statement per table per batch, through the pool Sequelize owns.
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { MessageItem, QuarantineItem } from './items';

// '|' cannot occur in a gateway id (protocol pattern) nor in a number.
const key = (gatewayId: string, boot: number, seq: number) => `${gatewayId}|${boot}|${seq}`;
export const messageKey = (m: { gatewayId: string; boot: number; seq: number }) => key(m.gatewayId, m.boot, m.seq);

/**
 * Inserts the batch's messages; returns the keys of those that were new (the rest were duplicates).
 * The rows go as one JSON document that PostgreSQL unpacks (jsonb_to_recordset): far less work in
 * Node than binding arrays, whose elements pg escapes one by one.
 */
export async function insertMessages(sequelize: Sequelize, t: Transaction, items: MessageItem[]): Promise<Set<string>> {
  if (items.length === 0) return new Set();
  const rows = items.map((m) => ({ g: m.gatewayId, b: m.boot, s: m.seq, u: m.unitId, st: m.stream, k: m.kind, ts: m.payload.ts, p: m.payload, r: m.receivedAt }));
  // Straight through the transaction's own pg connection: Sequelize's result handling costs more than the insert.
  const connection = (t as unknown as { connection: { query(text: string, values: unknown[]): Promise<{ rows: { k: string }[] }> } }).connection;
  const out = await connection.query(
    `INSERT INTO messages (gateway_id, boot, seq, unit_id, stream, kind, ts, payload, received_at)
     SELECT g, b, s, u, st, k, ts, p, to_timestamp(r / 1000.0)
     FROM jsonb_to_recordset($1::jsonb) AS x(g text, b bigint, s bigint, u text, st int, k text, ts timestamptz, p jsonb, r float8)
     ON CONFLICT DO NOTHING
     RETURNING gateway_id || '|' || boot || '|' || seq AS k`,
    [JSON.stringify(rows)],
  );
  return new Set(out.rows.map((r) => r.k));
}

// PostgreSQL text cannot hold NUL; a hostile payload (or a parser's message quoting it) may carry one.
const clean = (s: string | null) => (s === null ? null : s.replace(/\u0000/g, '\\0'));

export async function insertQuarantine(sequelize: Sequelize, t: Transaction, items: QuarantineItem[]) {
  if (items.length === 0) return;
  await sequelize.query(
    `INSERT INTO quarantine (gateway_id, topic, reason, excerpt) SELECT * FROM unnest($1::text[], $2::text[], $3::text[], $4::text[])`,
    {
      bind: [items.map((q) => clean(q.gatewayId)), items.map((q) => clean(q.topic.slice(0, 300))), items.map((q) => clean(q.reason)), items.map((q) => clean(q.excerpt))],
      transaction: t,
    },
  );
}
