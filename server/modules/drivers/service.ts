// Drivers and their assignments to units. An assignment covers [from, to); one unit has one driver at a time.
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { conflict, notFound } from '../../lib/errors';
import type { AuthUser } from '../../lib/middleware';
import { recordAudit } from '../audit/service';
import type { AssignmentRecord, DriverRecord } from './presenter';

const DRIVER_COLS = 'id, code, name, depot, active';

export async function listDrivers(db: Sequelize) {
  return db.query<DriverRecord>(`SELECT ${DRIVER_COLS} FROM drivers ORDER BY name, code`, { type: QueryTypes.SELECT });
}

export async function getDriver(db: Sequelize, id: number) {
  const [d] = await db.query<DriverRecord>(`SELECT ${DRIVER_COLS} FROM drivers WHERE id = $1`, { bind: [id], type: QueryTypes.SELECT });
  if (!d) throw notFound(`Driver ${id}`);
  return d;
}

export async function createDriver(db: Sequelize, actor: AuthUser, input: { code: string; name: string; depot?: string | null }, transaction?: Transaction) {
  const [taken] = await db.query(`SELECT 1 FROM drivers WHERE lower(code) = lower($1)`, { bind: [input.code], type: QueryTypes.SELECT, transaction });
  if (taken) throw conflict(`A driver with code ${input.code} already exists`);
  const [d] = await db.query<DriverRecord>(`INSERT INTO drivers (code, name, depot) VALUES ($1, $2, $3) RETURNING ${DRIVER_COLS}`, {
    bind: [input.code, input.name, input.depot ?? null], type: QueryTypes.SELECT, transaction,
  });
  await recordAudit(actor, 'driver.create', `driver:${d.id}`, { ...input }, transaction);
  return d;
}

export async function updateDriver(db: Sequelize, actor: AuthUser, id: number, input: { name?: string; depot?: string | null; active?: boolean }) {
  const before = await getDriver(db, id);
  const after = { ...before, ...Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined)) };
  const [d] = await db.query<DriverRecord>(`UPDATE drivers SET name = $2, depot = $3, active = $4, updated_at = now() WHERE id = $1 RETURNING ${DRIVER_COLS}`, {
    bind: [id, after.name, after.depot, after.active], type: QueryTypes.SELECT,
  });
  await recordAudit(actor, 'driver.update', `driver:${id}`, { before, after: input });
  return d;
}

const ASSIGNMENT_SELECT = `SELECT a.id, a.driver_id, d.code AS driver_code, d.name AS driver_name, a.unit_id, a.from_at, a.to_at
  FROM driver_assignments a JOIN drivers d ON d.id = a.driver_id`;

export async function listAssignments(db: Sequelize, q: { unitId?: string; driverId?: number }) {
  return db.query<AssignmentRecord>(
    `${ASSIGNMENT_SELECT} WHERE ($1::text IS NULL OR a.unit_id = $1) AND ($2::int IS NULL OR a.driver_id = $2) ORDER BY a.from_at DESC, a.id DESC LIMIT 1000`,
    { bind: [q.unitId ?? null, q.driverId ?? null], type: QueryTypes.SELECT },
  );
}

/** The existing assignment of the unit that overlaps [from, to), if any (an open end is infinity). */
export async function overlapping(db: Sequelize, unitId: string, from: Date, to: Date | null, transaction?: Transaction) {
  const [a] = await db.query<AssignmentRecord>(
    `${ASSIGNMENT_SELECT} WHERE a.unit_id = $1 AND a.from_at < coalesce($3::timestamptz, 'infinity') AND coalesce(a.to_at, 'infinity') > $2 ORDER BY a.from_at LIMIT 1`,
    { bind: [unitId, from.toISOString(), to?.toISOString() ?? null], type: QueryTypes.SELECT, transaction },
  );
  return a ?? null;
}

/** Serialises writers of assignments, so two overlapping ones cannot both pass the check. */
export const lockAssignments = (db: Sequelize, transaction: Transaction) => db.query('LOCK TABLE driver_assignments IN SHARE ROW EXCLUSIVE MODE', { transaction });

export async function insertAssignment(db: Sequelize, a: { driverId: number; unitId: string; from: Date; to: Date | null }, transaction: Transaction) {
  const [row] = await db.query<{ id: string }>(`INSERT INTO driver_assignments (driver_id, unit_id, from_at, to_at) VALUES ($1, $2, $3, $4) RETURNING id`, {
    bind: [a.driverId, a.unitId, a.from.toISOString(), a.to?.toISOString() ?? null], type: QueryTypes.SELECT, transaction,
  });
  return Number(row.id);
}

export async function createAssignment(db: Sequelize, actor: AuthUser, input: { driverId: number; unitId: string; from: Date; to?: Date | null }) {
  await getDriver(db, input.driverId);
  const [unit] = await db.query(`SELECT 1 FROM units WHERE id = $1`, { bind: [input.unitId], type: QueryTypes.SELECT });
  if (!unit) throw notFound(`Unit ${input.unitId}`);
  const id = await db.transaction(async (tx) => {
    await lockAssignments(db, tx);
    const clash = await overlapping(db, input.unitId, input.from, input.to ?? null, tx);
    if (clash) throw conflict(`${input.unitId} is already assigned to ${clash.driver_name} from ${clash.from_at.toISOString()}${clash.to_at ? ` to ${clash.to_at.toISOString()}` : ' (open)'}`);
    const newId = await insertAssignment(db, { ...input, to: input.to ?? null }, tx);
    await recordAudit(actor, 'assignment.create', `assignment:${newId}`, { driverId: input.driverId, unitId: input.unitId, from: input.from, to: input.to ?? null }, tx);
    return newId;
  });
  const [row] = await db.query<AssignmentRecord>(`${ASSIGNMENT_SELECT} WHERE a.id = $1`, { bind: [id], type: QueryTypes.SELECT });
  return row;
}

export async function deleteAssignment(db: Sequelize, actor: AuthUser, id: number) {
  const [row] = await db.query<AssignmentRecord>(`${ASSIGNMENT_SELECT} WHERE a.id = $1`, { bind: [id], type: QueryTypes.SELECT });
  if (!row) throw notFound(`Assignment ${id}`);
  await db.query(`DELETE FROM driver_assignments WHERE id = $1`, { bind: [id] });
  await recordAudit(actor, 'assignment.delete', `assignment:${id}`, { driverId: row.driver_id, unitId: row.unit_id, from: row.from_at, to: row.to_at });
}
