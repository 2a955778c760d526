import { Gateway } from '../../db/models/gateway';
import { secretMatches } from './secrets';

/** The broker's credential check: an active (not revoked) gateway with this secret. */
export async function checkGatewayCredential(gatewayId: string, secret: string): Promise<boolean> {
  const gw = await Gateway.findByPk(gatewayId, { attributes: ['gatewayId', 'secretHash', 'revokedAt'] });
  return Boolean(gw && !gw.revokedAt && secretMatches(secret, gw.secretHash));
}
