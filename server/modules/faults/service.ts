import { QueryTypes } from 'sequelize';
import { Unit } from '../../db/models/unit';
import type { FaultQuery } from '../../../shared/api/history';

export interface FaultRecord {
  id: string; unit_id: string; at: Date; source_address: number; spn: number; fmi: number; conversion_method: number;
  occurrence_count: number | null; lamps: Record<string, string>; episode_id: string | null;
}

/** Decoded DTCs, newest first; [from, to) on at. */
export async function listFaults(q: FaultQuery) {
  const sequelize = Unit.sequelize!;
  return sequelize.query<FaultRecord>(
    `SELECT id, unit_id, at, source_address, spn, fmi, conversion_method, occurrence_count, lamps, episode_id
     FROM faults
     WHERE ($1::text IS NULL OR unit_id = $1) AND ($2::timestamptz IS NULL OR at >= $2) AND ($3::timestamptz IS NULL OR at < $3)
       AND ($4::bigint IS NULL OR episode_id = $4)
     ORDER BY at DESC, id DESC LIMIT $5 OFFSET $6`,
    {
      bind: [q.unitId ?? null, q.from?.toISOString() ?? null, q.to?.toISOString() ?? null, q.episodeId ?? null, q.limit, q.offset],
      type: QueryTypes.SELECT,
    },
  );
}
