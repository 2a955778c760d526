// What a batch's judgements change, written in a handful of statements for the whole batch rather
// than a few per unit: episodes (upserted, ids filled in), vanished episodes, faults, DM1 tracker states.
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { FaultActivation } from '../../shared/j1939/dm1-tracker';
import { positionKey } from '../detection/positions';
import type { EventPosition } from '../detection/types';
import type { StoredEpisode } from './unit-memory';
import { deleteEpisodes, episodeRows } from './episode-store';

export interface BatchWrites {
  episodes: { unitId: string; entry: StoredEpisode }[];
  deleted: number[];
  faults: { unitId: string; activation: FaultActivation }[];
  /** Units whose faults are all replaced (recomputed from their whole CAN history). */
  faultResets: string[];
  dm1: { unitId: string; snapshot: unknown; last: EventPosition }[];
}

export const emptyWrites = (): BatchWrites => ({ episodes: [], deleted: [], faults: [], faultResets: [], dm1: [] });

const iso = (ms: number) => new Date(ms).toISOString();

export async function writeBatch(sequelize: Sequelize, t: Transaction, w: BatchWrites) {
  const q = (sql: string, bind: unknown[]) => sequelize.query(sql, { bind, transaction: t });
  await deleteEpisodes(sequelize, t, w.deleted);
  if (w.episodes.length) {
    const rows = episodeRows(w.episodes.map((e) => ({ unitId: e.unitId, episode: e.entry.episode })));
    const out = await sequelize.query<{ id: string; unit_id: string; stream: number; boot: string; seq: string }>(
      `INSERT INTO episodes (unit_id, stream, boot, seq, key_off_at, purge_seconds, loss_threshold_v, outcome, settled_by, ended_at,
          seconds_into_purge, ambient_c, min_ambient_after_c, freeze_exposure, next_key_on_at, evidence, final)
       SELECT unit_id, stream, boot, seq, key_off_at, purge_seconds, loss_threshold_v, outcome, settled_by, ended_at,
          seconds_into_purge, ambient_c, min_ambient_after_c, freeze_exposure, next_key_on_at, evidence, final
       FROM jsonb_to_recordset($1::jsonb) AS x(unit_id text, stream int, boot bigint, seq bigint, key_off_at timestamptz,
          purge_seconds int, loss_threshold_v float8, outcome text, settled_by text, ended_at timestamptz, seconds_into_purge float8,
          ambient_c float8, min_ambient_after_c float8, freeze_exposure text, next_key_on_at timestamptz, evidence jsonb, final boolean)
       ON CONFLICT (unit_id, stream, boot, seq) DO UPDATE SET
          outcome = EXCLUDED.outcome, settled_by = EXCLUDED.settled_by, ended_at = EXCLUDED.ended_at,
          seconds_into_purge = EXCLUDED.seconds_into_purge, ambient_c = EXCLUDED.ambient_c,
          min_ambient_after_c = EXCLUDED.min_ambient_after_c, freeze_exposure = EXCLUDED.freeze_exposure,
          next_key_on_at = EXCLUDED.next_key_on_at, evidence = EXCLUDED.evidence, final = EXCLUDED.final, updated_at = now()
       RETURNING id, unit_id, stream, boot, seq`,
      { bind: [JSON.stringify(rows)], type: QueryTypes.SELECT, transaction: t },
    );
    const ids = new Map(out.map((r) => [`${r.unit_id}|${r.stream}/${Number(r.boot)}/${Number(r.seq)}`, Number(r.id)]));
    for (const e of w.episodes) e.entry.id = ids.get(`${e.unitId}|${positionKey(e.entry.episode.keyOff)}`)!;
  }
  if (w.faultResets.length) await q(`DELETE FROM faults WHERE unit_id = ANY($1::text[])`, [w.faultResets]);
  if (w.faults.length) {
    const rows = w.faults.map(({ unitId, activation: f }) => ({
      unit_id: unitId, at: iso(f.at), source_address: f.sourceAddress, spn: f.spn, fmi: f.fmi,
      conversion_method: f.conversionMethod, occurrence_count: f.occurrenceCount, lamps: f.lamps,
    }));
    await q(
      `INSERT INTO faults (unit_id, at, source_address, spn, fmi, conversion_method, occurrence_count, lamps)
       SELECT * FROM jsonb_to_recordset($1::jsonb) AS x(unit_id text, at timestamptz, source_address int, spn int, fmi int,
         conversion_method int, occurrence_count int, lamps jsonb)
       ON CONFLICT DO NOTHING`,
      [JSON.stringify(rows)],
    );
  }
  if (w.dm1.length) {
    const rows = w.dm1.map((d) => ({ unit_id: d.unitId, snapshot: d.snapshot, last_stream: d.last.stream, last_boot: d.last.boot, last_seq: d.last.seq }));
    await q(
      `INSERT INTO unit_dm1_state (unit_id, snapshot, last_stream, last_boot, last_seq)
       SELECT * FROM jsonb_to_recordset($1::jsonb) AS x(unit_id text, snapshot jsonb, last_stream int, last_boot bigint, last_seq bigint)
       ON CONFLICT (unit_id) DO UPDATE SET snapshot = EXCLUDED.snapshot, last_stream = EXCLUDED.last_stream,
         last_boot = EXCLUDED.last_boot, last_seq = EXCLUDED.last_seq`,
      [JSON.stringify(rows)],
    );
  }
}
