// The hot path's SQL: one statement per table per batch (COPY for the raw rows), through the pool Sequelize owns.
import { Transaction, type Sequelize } from 'sequelize';
import { finished } from 'node:stream/promises';
import { from as copyFrom } from 'pg-copy-streams';
import type { MessageItem, QuarantineItem } from './items';

// '|' cannot occur in a gateway id (protocol pattern) nor in a number.
const key = (gatewayId: string, boot: number, seq: number) => `${gatewayId}|${boot}|${seq}`;
export const messageKey = (m: { gatewayId: string; boot: number; seq: number }) => key(m.gatewayId, m.boot, m.seq);

/** Which of a batch's messages were new: all of them (the usual case), or those whose keys are listed. */
export type FreshMessages = { all: true; size: number } | { all: false; size: number; keys: Set<string> };

interface RawConnection {
  query(text: string, values?: unknown[]): Promise<{ rowCount: number | null; rows: { k: string }[] }>;
  query<S extends NodeJS.WritableStream>(stream: S): S;
}

// COPY's text format: a backslash, tab, newline or carriage return inside a field is escaped. Ids and the
// timestamp cannot hold any (protocol patterns); a JSON text holds no raw control characters, only backslashes.
const copyField = (s: string) => (s.includes('\\') ? s.replace(/\\/g, '\\\\') : s);

/** The batch as COPY's text rows: gateway, boot, seq, unit, stream, kind, ts, payload, received_at. */
function copyRows(items: MessageItem[]): string {
  let out = '';
  // Arrival times repeat from one message to the next (many arrive in the same millisecond).
  let at = NaN;
  let atText = '';
  for (const m of items) {
    if (m.receivedAt !== at) atText = new Date((at = m.receivedAt)).toISOString();
    out += `${m.gatewayId}\t${m.boot}\t${m.seq}\t${m.unitId}\t${m.stream}\t${m.kind}\t${m.payload.ts}\t${copyField(JSON.stringify(m.payload))}\t${atText}\n`;
  }
  return out;
}

const UNIQUE_VIOLATION = '23505';

/**
 * The batch's transaction. Its BEGIN is not sent on its own: it rides in front of the batch's COPY, in
 * the same simple query (`BEGIN; COPY ...`; PostgreSQL runs the statements of one query in turn and the
 * COPY reads its data after them), so the usual batch makes one round trip to the database fewer. Under
 * load every round trip waits its turn in an event loop busy with hundreds of gateways' packets, so the
 * batch's round trips decide how soon its messages are committed and on the board. A batch without
 * messages, or one written again with its copies told apart, opens it on its own (`open`).
 */
export class BatchTransaction extends Transaction {
  private opened = false;

  constructor(sequelize: Sequelize) {
    super(sequelize, {});
  }

  // Called by Sequelize when the connection is taken: left to the first statement (see above).
  async begin() {}

  /** The text to put in front of the first statement: `BEGIN; ` once, then nothing. */
  opening(): string {
    if (this.opened) return '';
    this.opened = true;
    return 'BEGIN; ';
  }

  /** Opens the transaction on its own if no statement has opened it yet. */
  async open() {
    if (!this.opened) await this.connectionOf().query(this.opening());
  }

  connectionOf(): RawConnection {
    return (this as unknown as { connection: RawConnection }).connection;
  }
}

/** Runs `work` in a BatchTransaction: committed if it returns, rolled back if it throws (as sequelize.transaction does). */
export async function inBatchTransaction<T>(sequelize: Sequelize, work: (t: BatchTransaction) => Promise<T>): Promise<T> {
  const t = new BatchTransaction(sequelize);
  // Takes a connection from Sequelize's pool; `begin` above sends nothing.
  await (t as unknown as { prepareEnvironment(useCls: boolean): Promise<void> }).prepareEnvironment(false);
  let result: T;
  try {
    result = await work(t);
    await t.open(); // nothing was sent (an empty batch): a transaction to commit all the same
  } catch (err) {
    // ROLLBACK before BEGIN was sent only draws a warning from PostgreSQL; the connection goes back to the pool.
    await t.rollback().catch(() => {});
    throw err;
  }
  await t.commit();
  return result;
}

/** A batch's COPY met a row already stored (a redelivered copy): the transaction is aborted and goes again with `dedupe`. */
export class CopyInBatch extends Error {
  constructor(cause: unknown) {
    super('the batch holds a message already stored', { cause });
  }
}

/**
 * Inserts the batch's messages and tells which were new (the rest were duplicates, recognised by the
 * primary key). The usual batch holds no copy: its rows go by COPY, the cheapest way into PostgreSQL, and
 * all are new. COPY cannot skip a row that exists, so a batch with a copy in it fails as a whole, and so
 * does its transaction (CopyInBatch): the caller runs it again with `dedupe`, and then the rows go as one
 * JSON document that PostgreSQL unpacks (jsonb_to_recordset) with ON CONFLICT DO NOTHING, and the rows
 * this transaction wrote (xmin) are listed. (No savepoint on the usual path: it would cost a round trip
 * to the database in every batch for the rare one with a copy.)
 */
export async function insertMessages(t: BatchTransaction, items: MessageItem[], dedupe = false): Promise<FreshMessages> {
  if (items.length === 0) return { all: true, size: 0 };
  // Straight through the transaction's own pg connection: Sequelize's result handling costs more than the insert.
  const connection = t.connectionOf();
  if (!dedupe) {
    try {
      const copy = connection.query(copyFrom(`${t.opening()}COPY messages (gateway_id, boot, seq, unit_id, stream, kind, ts, payload, received_at) FROM STDIN`));
      // The rows as one write, then the end: a pipeline from a readable would cost an abort signal (and its
      // DOMException) per batch. Settles once PostgreSQL has answered the COPY, or with its error.
      copy.end(copyRows(items));
      await finished(copy);
      return { all: true, size: items.length };
    } catch (err) {
      throw (err as { code?: string }).code === UNIQUE_VIOLATION ? new CopyInBatch(err) : err;
    }
  }
  await t.open();
  const rows = items.map((m) => ({ g: m.gatewayId, b: m.boot, s: m.seq, u: m.unitId, st: m.stream, k: m.kind, ts: m.payload.ts, p: m.payload, r: m.receivedAt }));
  const doc = JSON.stringify(rows);
  const out = await connection.query(
    `INSERT INTO messages (gateway_id, boot, seq, unit_id, stream, kind, ts, payload, received_at)
     SELECT g, b, s, u, st, k, ts, p, to_timestamp(r / 1000.0)
     FROM jsonb_to_recordset($1::jsonb) AS x(g text, b bigint, s bigint, u text, st int, k text, ts timestamptz, p jsonb, r float8)
     ON CONFLICT DO NOTHING`,
    [doc],
  );
  if (out.rowCount === items.length) return { all: true, size: items.length };
  const written = await connection.query(
    `SELECT m.gateway_id || '|' || m.boot || '|' || m.seq AS k FROM messages m
     JOIN jsonb_to_recordset($1::jsonb) AS x(g text, b bigint, s bigint, ts timestamptz) ON (m.gateway_id, m.boot, m.seq, m.ts) = (x.g, x.b, x.s, x.ts)
     WHERE m.xmin = pg_current_xact_id()::xid`,
    [doc],
  );
  const keys = new Set(written.rows.map((r) => r.k));
  return { all: false, size: keys.size, keys };
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
