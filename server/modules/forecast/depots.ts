// Depots: the names the units carry, with coordinates an admin sets (for the forecast).
import { QueryTypes, type Sequelize } from 'sequelize';
import type { AuthUser } from '../../lib/middleware';
import { recordAudit } from '../audit/service';

export interface DepotRow {
  name: string;
  latitude: number | null;
  longitude: number | null;
  unit_count: string;
}

export async function listDepots(sequelize: Sequelize) {
  const rows = await sequelize.query<DepotRow>(
    `SELECT n.name, d.latitude, d.longitude, (SELECT count(*) FROM units u WHERE u.depot = n.name) AS unit_count
     FROM (SELECT depot AS name FROM units UNION SELECT name FROM depots) n LEFT JOIN depots d ON d.name = n.name ORDER BY n.name`,
    { type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({ name: r.name, latitude: r.latitude, longitude: r.longitude, unitCount: Number(r.unit_count) }));
}

export async function setDepotLocation(sequelize: Sequelize, actor: AuthUser, name: string, latitude: number, longitude: number) {
  await sequelize.query(
    `INSERT INTO depots (name, latitude, longitude, updated_at) VALUES ($1, $2, $3, now())
     ON CONFLICT (name) DO UPDATE SET latitude = $2, longitude = $3, updated_at = now()`,
    { bind: [name, latitude, longitude] },
  );
  await recordAudit(actor, 'depot.locate', `depot:${name}`, { latitude, longitude });
  return (await listDepots(sequelize)).find((d) => d.name === name)!;
}

export async function locatedDepots(sequelize: Sequelize) {
  return sequelize.query<{ name: string; latitude: number; longitude: number }>('SELECT name, latitude, longitude FROM depots ORDER BY name', { type: QueryTypes.SELECT });
}
