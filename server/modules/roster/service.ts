// Roster import: a preview that creates nothing, and an all-or-nothing commit in one transaction.
import { QueryTypes, UniqueConstraintError, type Sequelize, type Transaction } from 'sequelize';
import { AppError, conflict } from '../../lib/errors';
import type { AuthUser } from '../../lib/middleware';
import { recordAudit } from '../audit/service';
import { brokerPasswordHash, hashGatewaySecret, newGatewaySecret } from '../gateways/secrets';
import { DEFAULT_PURGE_SECONDS, defaultLossThresholdV } from '../../../shared/protocol/limits';
import type { RosterCommitResult } from '../../../shared/api/roster';
import { parseRoster, type Existing } from './parse';

async function loadExisting(sequelize: Sequelize, transaction?: Transaction): Promise<Existing> {
  const units = await sequelize.query<{ id: string }>('SELECT id FROM units', { type: QueryTypes.SELECT, transaction });
  const gateways = await sequelize.query<{ gateway_id: string; unit_id: string }>('SELECT gateway_id, unit_id FROM gateways', { type: QueryTypes.SELECT, transaction });
  return { units: new Set(units.map((u) => u.id)), gateways: new Map(gateways.map((g) => [g.gateway_id, g.unit_id])) };
}

export async function previewRoster(sequelize: Sequelize, csv: string) {
  return parseRoster(csv, await loadExisting(sequelize));
}

export async function commitRoster(sequelize: Sequelize, actor: AuthUser, csv: string): Promise<RosterCommitResult> {
  try {
    return await sequelize.transaction(async (transaction) => {
      // Serialises imports, so two admins committing the same file cannot both pass the checks.
      await sequelize.query(`SELECT pg_advisory_xact_lock(hashtext('afterwatch.roster'))`, { transaction });
      const preview = parseRoster(csv, await loadExisting(sequelize, transaction));
      if (!preview.ok) throw new AppError('roster_invalid', 422, `The roster has ${preview.errorCount} problem(s): nothing was created`, preview);
      const gateways: RosterCommitResult['gateways'] = [];
      for (const row of preview.rows) {
        const voltage = row.systemVoltage as 12 | 24;
        await sequelize.query(
          `INSERT INTO units (id, name, depot, system_voltage, purge_seconds, loss_threshold_v, link_spns, created_at, updated_at)
           VALUES ($1, $2, $3, $4, $5, $6, NULL, now(), now())`,
          { bind: [row.unitId, row.name, row.depot, voltage, row.purgeSeconds ?? DEFAULT_PURGE_SECONDS, defaultLossThresholdV(voltage)], transaction },
        );
        if (row.gatewayId) {
          const secret = newGatewaySecret();
          await sequelize.query(
            `INSERT INTO gateways (gateway_id, unit_id, secret_hash, broker_hash, stream, created_at, updated_at) VALUES ($1, $2, $3, $4, 0, now(), now())`,
            { bind: [row.gatewayId, row.unitId, hashGatewaySecret(secret), brokerPasswordHash(secret)], transaction },
          );
          gateways.push({ unitId: row.unitId, gatewayId: row.gatewayId, secret });
        }
      }
      await recordAudit(actor, 'roster.import', `roster:${preview.rows.length}`, { units: preview.rows.map((r) => r.unitId), gateways: gateways.map((g) => g.gatewayId) }, transaction);
      return { units: preview.rows.map((r) => r.unitId), gateways };
    });
  } catch (err) {
    if (err instanceof UniqueConstraintError) throw conflict('A unit or gateway in the file was created meanwhile: nothing was created, preview the file again');
    throw err;
  }
}
