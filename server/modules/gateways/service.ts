import { Gateway } from '../../db/models/gateway';
import { Unit } from '../../db/models/unit';
import { conflict, notFound } from '../../lib/errors';
import type { AuthUser } from '../../lib/middleware';
import { recordAudit } from '../audit/service';
import { brokerPasswordHash, hashGatewaySecret, newGatewaySecret } from './secrets';

export async function listGateways() {
  return Gateway.findAll({ order: [['unitId', 'ASC'], ['stream', 'ASC']] });
}

/** Provisions a gateway for a unit; the unit's previous gateway, if any, is revoked. The secret leaves only here. */
export async function provisionGateway(actor: AuthUser, gatewayId: string, unitId: string) {
  const sequelize = Gateway.sequelize!;
  const secret = newGatewaySecret();
  const revoked = await sequelize.transaction(async (transaction) => {
    const unit = await Unit.findByPk(unitId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!unit) throw notFound(`Unit ${unitId}`);
    if (await Gateway.findByPk(gatewayId, { transaction })) throw conflict(`Gateway ${gatewayId} already exists`);
    const previous = await Gateway.findAll({ where: { unitId }, transaction });
    const stream = previous.reduce((m, g) => Math.max(m, g.stream + 1), 0);
    const active = previous.filter((g) => !g.revokedAt);
    for (const g of active) await g.update({ revokedAt: new Date() }, { transaction });
    await Gateway.create({ gatewayId, unitId, secretHash: hashGatewaySecret(secret), brokerHash: brokerPasswordHash(secret), stream }, { transaction });
    await recordAudit(actor, 'gateway.create', `gateway:${gatewayId}`, { unitId, replaced: active.map((g) => g.gatewayId) }, transaction);
    return active.map((g) => g.gatewayId);
  });
  return { gatewayId, secret, revoked };
}

export async function revokeGateway(actor: AuthUser, gatewayId: string) {
  const gw = await Gateway.findByPk(gatewayId);
  if (!gw) throw notFound(`Gateway ${gatewayId}`);
  if (!gw.revokedAt) await gw.update({ revokedAt: new Date() });
  await recordAudit(actor, 'gateway.revoke', `gateway:${gatewayId}`, { unitId: gw.unitId });
}
