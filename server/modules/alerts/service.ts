import { QueryTypes, type Sequelize } from 'sequelize';
import { conflict, notFound } from '../../lib/errors';
import type { AuthUser } from '../../lib/middleware';
import { recordAudit } from '../audit/service';
import type { AlertView } from '../../../shared/realtime/envelope';

export type AlertKind = AlertView['kind'];
export type AlertStatusFilter = 'open' | 'acknowledged' | 'resolved' | 'active';

interface AlertRow {
  id: string; unit_id: string; depot: string; kind: AlertKind; status: AlertView['status']; raised_at: Date; episode_id: string | null;
  seconds_into_purge: number | null; ambient_c: number | null; min_ambient_after_c: number | null; freeze_exposure: string | null;
  escalated_at: Date | null; acknowledged_at: Date | null; ack_email: string | null; resolved_at: Date | null; res_email: string | null; comment: string | null;
}

const iso = (d: Date | null) => (d ? d.toISOString() : null);

export function presentAlert(r: AlertRow): AlertView {
  return {
    id: Number(r.id), unitId: r.unit_id, depot: r.depot, kind: r.kind, status: r.status, raisedAt: r.raised_at.toISOString(),
    episodeId: r.episode_id === null ? null : Number(r.episode_id), secondsIntoPurge: r.seconds_into_purge, ambientC: r.ambient_c,
    minAmbientAfterC: r.min_ambient_after_c, freezeExposure: r.freeze_exposure, escalatedAt: iso(r.escalated_at),
    acknowledgedAt: iso(r.acknowledged_at), acknowledgedBy: r.ack_email, resolvedAt: iso(r.resolved_at), resolvedBy: r.res_email, comment: r.comment,
  };
}

const SELECT = `SELECT a.id, a.unit_id, u.depot, a.kind, a.status, a.raised_at, a.episode_id, e.seconds_into_purge, e.ambient_c,
    e.min_ambient_after_c, e.freeze_exposure, a.escalated_at, a.acknowledged_at, ua.email AS ack_email, a.resolved_at,
    ur.email AS res_email, a.comment
  FROM alerts a JOIN units u ON u.id = a.unit_id LEFT JOIN episodes e ON e.id = a.episode_id
  LEFT JOIN users ua ON ua.id = a.acknowledged_by LEFT JOIN users ur ON ur.id = a.resolved_by`;

export async function listAlerts(sequelize: Sequelize, q: { status?: AlertStatusFilter; unitId?: string; limit: number }) {
  const status = q.status === 'active' ? ['open', 'acknowledged'] : q.status ? [q.status] : ['open', 'acknowledged', 'resolved'];
  const rows = await sequelize.query<AlertRow>(
    `${SELECT} WHERE a.status = ANY($1::text[]) AND ($2::text IS NULL OR a.unit_id = $2) ORDER BY a.raised_at DESC, a.id DESC LIMIT $3`,
    { bind: [status, q.unitId ?? null, q.limit], type: QueryTypes.SELECT },
  );
  return rows.map(presentAlert);
}

export async function getAlert(sequelize: Sequelize, id: number): Promise<AlertView> {
  const rows = await sequelize.query<AlertRow>(`${SELECT} WHERE a.id = $1`, { bind: [id], type: QueryTypes.SELECT });
  if (!rows[0]) throw notFound(`Alert ${id}`);
  return presentAlert(rows[0]);
}

/** Raises an alert once per episode and kind; returns it when it is new. */
export async function raiseAlert(sequelize: Sequelize, unitId: string, episodeId: number, kind: AlertKind): Promise<AlertView | null> {
  const rows = await sequelize.query<{ id: string }>(
    `INSERT INTO alerts (unit_id, episode_id, kind) VALUES ($1, $2, $3) ON CONFLICT (episode_id, kind) DO NOTHING RETURNING id`,
    { bind: [unitId, episodeId, kind], type: QueryTypes.SELECT },
  );
  return rows[0] ? getAlert(sequelize, Number(rows[0].id)) : null;
}

/** Closes the service's own alerts for an episode whose outcome changed (no person did it: no actor). */
export async function settleAlerts(sequelize: Sequelize, episodeId: number, kinds: AlertKind[], comment: string): Promise<AlertView[]> {
  const rows = await sequelize.query<{ id: string }>(
    `UPDATE alerts SET status = 'resolved', resolved_at = now(), comment = COALESCE(comment || ' · ', '') || $3
     WHERE episode_id = $1 AND kind = ANY($2::text[]) AND status <> 'resolved' RETURNING id`,
    { bind: [episodeId, kinds, comment], type: QueryTypes.SELECT },
  );
  return Promise.all(rows.map((r) => getAlert(sequelize, Number(r.id))));
}

export async function handleAlert(sequelize: Sequelize, actor: AuthUser, id: number, action: 'acknowledge' | 'resolve', comment: string | undefined) {
  const current = await getAlert(sequelize, id);
  if (current.status === 'resolved') throw conflict('This alert is already resolved');
  if (action === 'acknowledge' && current.status === 'acknowledged') throw conflict('This alert is already acknowledged');
  const sql =
    action === 'acknowledge'
      ? `UPDATE alerts SET status = 'acknowledged', acknowledged_at = now(), acknowledged_by = $2, comment = COALESCE($3, comment) WHERE id = $1`
      : `UPDATE alerts SET status = 'resolved', resolved_at = now(), resolved_by = $2,
           acknowledged_at = COALESCE(acknowledged_at, now()), acknowledged_by = COALESCE(acknowledged_by, $2), comment = COALESCE($3, comment) WHERE id = $1`;
  await sequelize.query(sql, { bind: [id, actor.id, comment ?? null] });
  await recordAudit(actor, `alert.${action}`, `alert:${id}`, { unitId: current.unitId, kind: current.kind, comment: comment ?? null });
  return getAlert(sequelize, id);
}

/** Open alerts left unacknowledged past the limit are marked escalated. */
export async function escalateOverdue(sequelize: Sequelize, olderThanMs: number): Promise<AlertView[]> {
  const rows = await sequelize.query<{ id: string }>(
    `UPDATE alerts SET escalated_at = now() WHERE status = 'open' AND escalated_at IS NULL AND raised_at < now() - ($1::bigint * interval '1 millisecond') RETURNING id`,
    { bind: [olderThanMs], type: QueryTypes.SELECT },
  );
  return Promise.all(rows.map((r) => getAlert(sequelize, Number(r.id))));
}
