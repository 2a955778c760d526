// The hot path's SQL: one statement per table per batch, through the pool Sequelize owns.
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { MessageItem, QuarantineItem } from './items';

const key = (gatewayId: string, boot: number, seq: number) => `${gatewayId}\0${boot}\0${seq}`;
export const messageKey = (m: { gatewayId: string; boot: number; seq: number }) => key(m.gatewayId, m.boot, m.seq);

/** Inserts the batch's messages; returns the keys of those that were new (the rest were duplicates). */
export async function insertMessages(sequelize: Sequelize, t: Transaction, items: MessageItem[]): Promise<Set<string>> {
  if (items.length === 0) return new Set();
  const rows = await sequelize.query<{ gateway_id: string; boot: string; seq: string }>(
    `INSERT INTO messages (gateway_id, boot, seq, unit_id, stream, kind, ts, payload, received_at)
     SELECT * FROM unnest($1::text[], $2::bigint[], $3::bigint[], $4::text[], $5::int[], $6::text[], $7::timestamptz[], $8::jsonb[], $9::timestamptz[])
     ON CONFLICT DO NOTHING
     RETURNING gateway_id, boot, seq`,
    {
      bind: [
        items.map((m) => m.gatewayId),
        items.map((m) => m.boot),
        items.map((m) => m.seq),
        items.map((m) => m.unitId),
        items.map((m) => m.stream),
        items.map((m) => m.kind),
        items.map((m) => new Date(m.ts).toISOString()),
        items.map((m) => JSON.stringify(m.payload)),
        items.map((m) => new Date(m.receivedAt).toISOString()),
      ],
      type: QueryTypes.SELECT,
      transaction: t,
    },
  );
  return new Set(rows.map((r) => key(r.gateway_id, Number(r.boot), Number(r.seq))));
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
