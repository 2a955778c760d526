import { QueryTypes } from 'sequelize';
import { Unit } from '../../db/models/unit';
import type { EpisodeQuery } from '../../../shared/api/history';

export interface EpisodeRecord {
  id: string; unit_id: string; key_off_at: Date; purge_seconds: number; outcome: string; ended_at: Date | null;
  seconds_into_purge: number | null; settled_by: string | null; ambient_c: number | null; min_ambient_after_c: number | null;
  freeze_exposure: string | null; evidence: unknown; final: boolean;
}

/** Key-off purge episodes, newest first; [from, to) on keyOffAt. */
export async function listEpisodes(q: EpisodeQuery) {
  const sequelize = Unit.sequelize!;
  return sequelize.query<EpisodeRecord>(
    `SELECT id, unit_id, key_off_at, purge_seconds, outcome, ended_at, seconds_into_purge, settled_by, ambient_c,
            min_ambient_after_c, freeze_exposure, evidence, final
     FROM episodes
     WHERE ($1::text IS NULL OR unit_id = $1) AND ($2::timestamptz IS NULL OR key_off_at >= $2)
       AND ($3::timestamptz IS NULL OR key_off_at < $3) AND ($4::text IS NULL OR outcome = $4)
     ORDER BY key_off_at DESC, id DESC LIMIT $5 OFFSET $6`,
    {
      bind: [q.unitId ?? null, q.from?.toISOString() ?? null, q.to?.toISOString() ?? null, q.outcome ?? null, q.limit, q.offset],
      type: QueryTypes.SELECT,
    },
  );
}
