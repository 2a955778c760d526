// Episodes, faults and the DM1 tracker's state: written in the batch's transaction, read back at start-up.
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { Episode, EventPosition, UnitEvent } from '../detection/types';
import type { CanFrame } from '../../shared/protocol/messages';

const iso = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());

/** Episodes as rows for a jsonb_to_recordset upsert (batch-writes.ts). */
export function episodeRows(items: { unitId: string; episode: Episode }[]) {
  return items.map(({ unitId, episode: e }) => ({
    unit_id: unitId, stream: e.keyOff.stream, boot: e.keyOff.boot, seq: e.keyOff.seq, key_off_at: iso(e.keyOff.ts),
    purge_seconds: e.purgeSeconds, loss_threshold_v: e.lossThresholdV, outcome: e.outcome, settled_by: e.settledBy,
    ended_at: iso(e.endedAt), seconds_into_purge: e.secondsIntoPurge, ambient_c: e.ambientC,
    min_ambient_after_c: e.minAmbientAfterC, freeze_exposure: e.freezeExposure, next_key_on_at: iso(e.nextKeyOnAt),
    evidence: e.evidence, final: e.final,
  }));
}

interface EpisodeRow {
  id: string; stream: number; boot: string; seq: string; key_off_at: Date; purge_seconds: number; loss_threshold_v: number;
  outcome: Episode['outcome']; settled_by: Episode['settledBy']; ended_at: Date | null; seconds_into_purge: number | null;
  ambient_c: number | null; min_ambient_after_c: number | null; freeze_exposure: Episode['freezeExposure']; next_key_on_at: Date | null;
  evidence: EventPosition | null; final: boolean;
}

const ms = (d: Date | null) => (d ? d.getTime() : null);

export function episodeFromRow(r: EpisodeRow): { id: number; episode: Episode } {
  return {
    id: Number(r.id),
    episode: {
      keyOff: { stream: r.stream, boot: Number(r.boot), seq: Number(r.seq), ts: r.key_off_at.getTime() },
      purgeSeconds: r.purge_seconds, lossThresholdV: r.loss_threshold_v, outcome: r.outcome, settledBy: r.settled_by,
      endedAt: ms(r.ended_at), secondsIntoPurge: r.seconds_into_purge, ambientC: r.ambient_c, evidence: r.evidence,
      final: r.final, minAmbientAfterC: r.min_ambient_after_c, freezeExposure: r.freeze_exposure, nextKeyOnAt: ms(r.next_key_on_at),
    },
  };
}

/** The unit's episodes from a position on (all when `from` is null), in key-off order. */
export async function loadEpisodes(sequelize: Sequelize, unitId: string, from: EventPosition | null, t?: Transaction) {
  const rows = await sequelize.query<EpisodeRow>(
    `SELECT * FROM episodes WHERE unit_id = $1 AND ($2::int IS NULL OR (stream, boot, seq) >= ($2, $3, $4)) ORDER BY stream, boot, seq`,
    { bind: [unitId, from?.stream ?? null, from?.boot ?? null, from?.seq ?? null], type: QueryTypes.SELECT, transaction: t },
  );
  return rows.map(episodeFromRow);
}

/** The latest episodes of a unit, newest first. */
export async function latestEpisodes(sequelize: Sequelize, unitId: string, limit: number, t?: Transaction) {
  const rows = await sequelize.query<EpisodeRow>(
    `SELECT * FROM episodes WHERE unit_id = $1 ORDER BY stream DESC, boot DESC, seq DESC LIMIT $2`,
    { bind: [unitId, limit], type: QueryTypes.SELECT, transaction: t },
  );
  return rows.map(episodeFromRow);
}

// Ordered by position, then arrival: of two copies at one position the first received wins (protocol).
interface MessageRow { stream: number; boot: string; seq: string; kind: string; payload: Record<string, any>; received_at: Date }

export function eventFromRow(r: MessageRow): { event: UnitEvent; frames: CanFrame[] | null; receivedAt: number } {
  const p = r.payload;
  const base = { stream: r.stream, boot: Number(r.boot), seq: Number(r.seq), ts: Date.parse(p.ts) };
  let event: UnitEvent;
  if (r.kind === 'telemetry') event = { kind: 'telemetry', ...base, key: p.key, supplyV: p.supplyV, ambientC: p.ambientC ?? null, ecmAwake: p.ecmAwake };
  else if (r.kind === 'power') {
    const prev = p.prevShutdown ? { ts: Date.parse(p.prevShutdown.ts), cause: p.prevShutdown.cause } : null;
    event = { kind: 'power', ...base, event: p.event, supplyV: p.supplyV, prevShutdown: prev };
  } else event = { kind: 'can', ...base };
  return { event, frames: r.kind === 'can' ? p.frames : null, receivedAt: r.received_at.getTime() };
}

const COLUMNS = 'm.stream, m.boot, m.seq, m.kind, m.payload, m.received_at';
// A bound on (boot, seq) for each of the unit's gateways: the position's own for its stream's gateway, none
// for the others. Read per gateway (LATERAL), so that each is a range of the primary key (gateway, boot, seq, ts);
// a gateway's messages are its unit's (the gateway's row names the unit for good).
const bound = (none: string) => `(CASE WHEN g.stream = $2 THEN $3::bigint ELSE ${none} END, CASE WHEN g.stream = $2 THEN $4::bigint ELSE ${none} END)`;
const MAX_BIGINT = '9223372036854775807';
/** Extra rows read per gateway for the tail, so that copies of one position (told apart by ts) do not push the first-received one out. */
const COPY_MARGIN = 10;

/**
 * A unit's messages from a position on (or its last `beforeTail` messages before it; the last of all without
 * a position), in position order. Positions are read through the messages' primary key, gateway by gateway
 * (a unit's stream is one gateway): no index of their own to keep up on every insert. Without a position, a
 * unit's messages of some kinds come through the (unit, kind, ts) index.
 */
export async function loadEvents(sequelize: Sequelize, unitId: string, opts: { from?: EventPosition | null; kinds?: string[]; beforeTail?: number }, t?: Transaction) {
  const kinds = opts.kinds ?? ['telemetry', 'power', 'can'];
  const from = opts.from ?? null;
  const tail = opts.beforeTail ? Number(opts.beforeTail) : 0;
  const position = [unitId, from?.stream ?? null, from?.boot ?? null, from?.seq ?? null, kinds];
  const [sql, bind] = tail
    ? [
        `SELECT * FROM (
           SELECT x.* FROM gateways g CROSS JOIN LATERAL (
             SELECT ${COLUMNS} FROM messages m
             WHERE m.gateway_id = g.gateway_id AND (m.boot, m.seq) < ${bound(MAX_BIGINT)} AND m.kind = ANY($5::text[])
             ORDER BY m.boot DESC, m.seq DESC, m.ts DESC LIMIT ${tail + COPY_MARGIN}) x
           WHERE g.unit_id = $1 AND ($2::int IS NULL OR g.stream <= $2)
           ORDER BY x.stream DESC, x.boot DESC, x.seq DESC, x.received_at LIMIT ${tail}) y
         ORDER BY stream, boot, seq, received_at`,
        position,
      ]
    : from
      ? [
          `SELECT x.* FROM gateways g CROSS JOIN LATERAL (
             SELECT ${COLUMNS} FROM messages m
             WHERE m.gateway_id = g.gateway_id AND (m.boot, m.seq) >= ${bound('-1')} AND m.kind = ANY($5::text[])) x
           WHERE g.unit_id = $1 AND g.stream >= $2
           ORDER BY x.stream, x.boot, x.seq, x.received_at`,
          position,
        ]
      : [`SELECT ${COLUMNS} FROM messages m WHERE m.unit_id = $1 AND m.kind = ANY($2::text[]) ORDER BY m.stream, m.boot, m.seq, m.received_at`, [unitId, kinds]];
  const rows = await sequelize.query<MessageRow>(sql, { bind, type: QueryTypes.SELECT, transaction: t });
  return rows.map(eventFromRow);
}

export async function loadDm1State(sequelize: Sequelize, unitId: string) {
  const rows = await sequelize.query<{ snapshot: unknown; last_stream: number; last_boot: string; last_seq: string }>(
    `SELECT snapshot, last_stream, last_boot, last_seq FROM unit_dm1_state WHERE unit_id = $1`,
    { bind: [unitId], type: QueryTypes.SELECT },
  );
  const r = rows[0];
  return r ? { snapshot: r.snapshot, last: { stream: r.last_stream, boot: Number(r.last_boot), seq: Number(r.last_seq) } } : null;
}

/** Removes episodes that re-judging no longer finds (their faults keep their rows, unlinked). */
export async function deleteEpisodes(sequelize: Sequelize, t: Transaction, ids: number[]) {
  if (!ids.length) return;
  await sequelize.query(`DELETE FROM episodes WHERE id = ANY($1::bigint[])`, { bind: [ids], transaction: t });
}

/** One boot's events and the next boot's (which carries its boot record), through the primary key. */
export async function loadBootEvents(sequelize: Sequelize, unitId: string, stream: number, boot: number, t?: Transaction) {
  const rows = await sequelize.query<MessageRow>(
    `SELECT ${COLUMNS} FROM gateways g JOIN messages m ON m.gateway_id = g.gateway_id
     WHERE g.unit_id = $1 AND g.stream = $2 AND m.boot IN ($3::bigint, $3::bigint + 1) ORDER BY m.stream, m.boot, m.seq, m.received_at`,
    { bind: [unitId, stream, boot], type: QueryTypes.SELECT, transaction: t },
  );
  return rows.map(eventFromRow);
}
