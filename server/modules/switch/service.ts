import { randomBytes } from 'node:crypto';
import { QueryTypes, type Sequelize } from 'sequelize';
import QRCode from 'qrcode';
import { notFound } from '../../lib/errors';
import type { AuthUser } from '../../lib/middleware';
import { recordAudit } from '../audit/service';
import { Unit } from '../../db/models/unit';

export const switchPath = (token: string) => `/switch/${token}`;

/** 192 random bits in the URL: unguessable, and only ever shows one unit's hold or clear. */
export async function issueSwitchToken(sequelize: Sequelize, actor: AuthUser, unitId: string) {
  if (!(await Unit.findByPk(unitId))) throw notFound(`Unit ${unitId}`);
  const token = randomBytes(24).toString('base64url');
  await sequelize.query(
    `INSERT INTO switch_tokens (unit_id, token) VALUES ($1, $2) ON CONFLICT (unit_id) DO UPDATE SET token = EXCLUDED.token, created_at = now()`,
    { bind: [unitId, token] },
  );
  await recordAudit(actor, 'switch.issue', `unit:${unitId}`, null);
  return { unitId, token, path: switchPath(token) };
}

export async function revokeSwitchToken(sequelize: Sequelize, actor: AuthUser, unitId: string) {
  const rows = await sequelize.query(`DELETE FROM switch_tokens WHERE unit_id = $1 RETURNING unit_id`, { bind: [unitId], type: QueryTypes.SELECT });
  if (!rows.length) throw notFound(`A switch page for unit ${unitId}`);
  await recordAudit(actor, 'switch.revoke', `unit:${unitId}`, null);
}

export async function unitOfSwitchToken(sequelize: Sequelize, token: string): Promise<string | null> {
  if (!/^[A-Za-z0-9_-]{16,64}$/.test(token)) return null;
  const rows = await sequelize.query<{ unit_id: string }>(`SELECT unit_id FROM switch_tokens WHERE token = $1`, { bind: [token], type: QueryTypes.SELECT });
  return rows[0]?.unit_id ?? null;
}

/** The printable sheet of a depot (or the whole fleet): every unit with a switch page, its link and QR code as SVG. */
export async function switchSheet(sequelize: Sequelize, origin: string, depot?: string) {
  const rows = await sequelize.query<{ unit_id: string; name: string; depot: string; token: string }>(
    `SELECT s.unit_id, u.name, u.depot, s.token FROM switch_tokens s JOIN units u ON u.id = s.unit_id
     WHERE ($1::text IS NULL OR u.depot = $1) ORDER BY u.depot, s.unit_id`,
    { bind: [depot ?? null], type: QueryTypes.SELECT },
  );
  return Promise.all(
    rows.map(async (r) => {
      const url = `${origin}${switchPath(r.token)}`;
      const qrSvg = await QRCode.toString(url, { type: 'svg', errorCorrectionLevel: 'M', margin: 1 });
      return { unitId: r.unit_id, name: r.name, depot: r.depot, url, qrSvg };
    }),
  );
}
