import { QueryTypes, type Sequelize } from 'sequelize';
import { badRequest, conflict, forbidden, notFound } from '../../lib/errors';
import type { AuthUser } from '../../lib/middleware';
import { recordAudit } from '../audit/service';
import { judgeCoilResistance } from '../../../shared/checks/coil-resistance';
import type { CheckRecord, WorkOrderClose, WorkOrderCreate, WorkOrderView } from '../../../shared/api/work-orders';
import { presentWorkOrder, type CheckRow, type PhotoRow, type WorkOrderRow } from './presenter';
import { resolveSource } from './source';

const SELECT = `SELECT w.*, u.name AS unit_name, u.depot, u.system_voltage, ua.email AS assignee_email, ua.name AS assignee_name,
    uc.email AS created_by_email, ux.email AS closed_by_email
  FROM work_orders w JOIN units u ON u.id = w.unit_id LEFT JOIN users ua ON ua.id = w.assignee_id
  LEFT JOIN users uc ON uc.id = w.created_by LEFT JOIN users ux ON ux.id = w.closed_by`;

export async function getWorkOrder(sequelize: Sequelize, id: number): Promise<WorkOrderView> {
  const [w] = await sequelize.query<WorkOrderRow>(`${SELECT} WHERE w.id = $1`, { bind: [id], type: QueryTypes.SELECT });
  if (!w) throw notFound(`Work order ${id}`);
  const checks = await sequelize.query<CheckRow>(
    `SELECT c.*, u.email AS recorded_by_email FROM work_order_checks c LEFT JOIN users u ON u.id = c.recorded_by WHERE c.work_order_id = $1 ORDER BY c.recorded_at`,
    { bind: [id], type: QueryTypes.SELECT },
  );
  const photos = await sequelize.query<PhotoRow>(
    `SELECT p.*, u.email AS uploaded_by_email FROM work_order_photos p LEFT JOIN users u ON u.id = p.uploaded_by WHERE p.work_order_id = $1 ORDER BY p.id`,
    { bind: [id], type: QueryTypes.SELECT },
  );
  return presentWorkOrder(w, checks, photos);
}

export async function listWorkOrders(sequelize: Sequelize, q: { status?: string; unitId?: string; assigneeId?: number; limit: number }) {
  const statuses = q.status === 'active' ? ['open', 'inProgress'] : q.status ? [q.status] : ['open', 'inProgress', 'closed'];
  const rows = await sequelize.query<WorkOrderRow>(
    `${SELECT} WHERE w.status = ANY($1::text[]) AND ($2::text IS NULL OR w.unit_id = $2) AND ($3::int IS NULL OR w.assignee_id = $3)
     ORDER BY w.created_at DESC, w.id DESC LIMIT $4`,
    { bind: [statuses, q.unitId ?? null, q.assigneeId ?? null, q.limit], type: QueryTypes.SELECT },
  );
  return rows.map((w) => presentWorkOrder(w, [], []));
}

export async function listTechnicians(sequelize: Sequelize) {
  return sequelize.query<{ id: number; email: string; name: string }>(
    `SELECT id, email, name FROM users WHERE role = 'technician' AND active ORDER BY name, email`,
    { type: QueryTypes.SELECT },
  );
}

async function assertTechnician(sequelize: Sequelize, userId: number) {
  const [u] = await sequelize.query<{ role: string; active: boolean }>('SELECT role, active FROM users WHERE id = $1', { bind: [userId], type: QueryTypes.SELECT });
  if (!u) throw notFound(`User ${userId}`);
  if (u.role !== 'technician' || !u.active) throw badRequest(`User ${userId} is not an active technician`);
}

export async function createWorkOrder(sequelize: Sequelize, actor: AuthUser, input: WorkOrderCreate) {
  if (input.assigneeId) await assertTechnician(sequelize, input.assigneeId);
  const id = await sequelize.transaction(async (transaction) => {
    const src = await resolveSource(sequelize, input.source, transaction);
    const [row] = await sequelize.query<{ id: string }>(
      `INSERT INTO work_orders (unit_id, source_kind, alert_id, episode_id, fault_id, title, assignee_id, created_by)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8) RETURNING id`,
      { bind: [src.unitId, input.source.kind, src.alertId, src.episodeId, src.faultId, input.title ?? src.title, input.assigneeId ?? null, actor.id], type: QueryTypes.SELECT, transaction },
    );
    await recordAudit(actor, 'workOrder.create', `workOrder:${row.id}`, { unitId: src.unitId, source: input.source, assigneeId: input.assigneeId ?? null }, transaction);
    return Number(row.id);
  });
  return getWorkOrder(sequelize, id);
}

async function current(sequelize: Sequelize, id: number) {
  const w = await getWorkOrder(sequelize, id);
  if (w.status === 'closed') throw conflict(`Work order ${id} is already closed`);
  return w;
}

export async function assignWorkOrder(sequelize: Sequelize, actor: AuthUser, id: number, assigneeId: number) {
  await current(sequelize, id);
  await assertTechnician(sequelize, assigneeId);
  await sequelize.query('UPDATE work_orders SET assignee_id = $2, updated_at = now() WHERE id = $1', { bind: [id, assigneeId] });
  await recordAudit(actor, 'workOrder.assign', `workOrder:${id}`, { assigneeId });
  return getWorkOrder(sequelize, id);
}

/** Only the assigned technician records on a work order; the first record puts it in progress. */
export async function assertAssignee(sequelize: Sequelize, actor: AuthUser, id: number) {
  const w = await current(sequelize, id);
  if (w.assignee?.id !== actor.id) throw forbidden('Only the technician assigned to this work order may record on it');
  return w;
}

async function markInProgress(sequelize: Sequelize, id: number) {
  await sequelize.query(`UPDATE work_orders SET status = 'inProgress', updated_at = now() WHERE id = $1 AND status = 'open'`, { bind: [id] });
}

export async function recordCheck(sequelize: Sequelize, actor: AuthUser, id: number, check: CheckRecord) {
  const w = await assertAssignee(sequelize, actor, id);
  const systemVoltage = w.systemVoltage === 24 ? 24 : 12;
  const coil = check.key === 'coilResistance' ? judgeCoilResistance(check.ohms, systemVoltage) : null;
  const verdict = coil ? coil.verdict : (check as { result: 'pass' | 'fail' }).result;
  await sequelize.query(
    `INSERT INTO work_order_checks (work_order_id, check_key, ohms, system_voltage, verdict, note, recorded_by, recorded_at)
     VALUES ($1, $2, $3, $4, $5, $6, $7, now())
     ON CONFLICT (work_order_id, check_key) DO UPDATE SET ohms = $3, system_voltage = $4, verdict = $5, note = $6, recorded_by = $7, recorded_at = now()`,
    { bind: [id, check.key, check.key === 'coilResistance' ? check.ohms : null, coil ? systemVoltage : null, verdict, check.note || null, actor.id] },
  );
  await markInProgress(sequelize, id);
  await recordAudit(actor, 'workOrder.check', `workOrder:${id}`, { ...check, verdict });
  return getWorkOrder(sequelize, id);
}

export async function addPhoto(sequelize: Sequelize, actor: AuthUser, id: number, photo: { storedName: string; originalName: string; mime: string; sizeBytes: number }) {
  await sequelize.query(
    `INSERT INTO work_order_photos (work_order_id, stored_name, original_name, mime, size_bytes, uploaded_by) VALUES ($1, $2, $3, $4, $5, $6)`,
    { bind: [id, photo.storedName, photo.originalName, photo.mime, photo.sizeBytes, actor.id] },
  );
  await markInProgress(sequelize, id);
  await recordAudit(actor, 'workOrder.photo', `workOrder:${id}`, { originalName: photo.originalName, mime: photo.mime, sizeBytes: photo.sizeBytes });
  return getWorkOrder(sequelize, id);
}

export async function findPhoto(sequelize: Sequelize, workOrderId: number, photoId: number) {
  const [p] = await sequelize.query<{ stored_name: string; mime: string }>(
    'SELECT stored_name, mime FROM work_order_photos WHERE id = $1 AND work_order_id = $2',
    { bind: [photoId, workOrderId], type: QueryTypes.SELECT },
  );
  if (!p) throw notFound(`Photo ${photoId}`);
  return p;
}

/** Closing needs the work to have started, unless the order is cancelled. */
export async function closeWorkOrder(sequelize: Sequelize, actor: AuthUser, id: number, input: WorkOrderClose) {
  const w = await current(sequelize, id);
  if (w.status === 'open' && input.outcome !== 'cancelled') throw conflict('Nothing has been recorded on this work order yet: only "cancelled" can close it now');
  await sequelize.query(
    `UPDATE work_orders SET status = 'closed', outcome = $2, outcome_note = $3, closed_at = now(), closed_by = $4, updated_at = now() WHERE id = $1`,
    { bind: [id, input.outcome, input.note || null, actor.id] },
  );
  await recordAudit(actor, 'workOrder.close', `workOrder:${id}`, { outcome: input.outcome, note: input.note ?? null });
  return getWorkOrder(sequelize, id);
}
