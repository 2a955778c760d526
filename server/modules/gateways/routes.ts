import { Router } from 'express';
import { requirePermission } from '../../lib/middleware';
import type { AppContext } from '../../lib/context';
import { GatewayCreateSchema, GatewayIdSchema } from '../../../shared/api/units';
import type { Gateway } from '../../db/models/gateway';
import { listGateways, provisionGateway, revokeGateway } from './service';

export function gatewayRoutes(ctx: AppContext) {
  const r = Router();
  r.use(requirePermission('gateways.manage'));
  const present = (g: Gateway) => ({
    gatewayId: g.gatewayId,
    unitId: g.unitId,
    createdAt: g.createdAt.toISOString(),
    revokedAt: g.revokedAt ? g.revokedAt.toISOString() : null,
    connected: ctx.fleet.gatewayConnected?.(g.gatewayId) ?? false,
    lastSeenAt: g.lastSeenAt ? g.lastSeenAt.toISOString() : null,
  });
  r.get('/', async (_req, res) => {
    res.json((await listGateways()).map(present));
  });
  r.post('/', async (req, res) => {
    const body = GatewayCreateSchema.parse(req.body);
    const { gatewayId, secret, revoked } = await provisionGateway(req.user!, body.gatewayId, body.unitId);
    for (const id of revoked) await ctx.fleet.gatewayRevoked?.(id);
    await ctx.fleet.unitChanged?.(body.unitId);
    res.status(201).json({ gatewayId, secret });
  });
  r.delete('/:gatewayId', async (req, res) => {
    const id = GatewayIdSchema.parse(req.params.gatewayId);
    await revokeGateway(req.user!, id);
    await ctx.fleet.gatewayRevoked?.(id);
    res.status(204).end();
  });
  return r;
}
