import { Router, type Request } from 'express';
import { z } from 'zod';
import { requirePermission } from '../../lib/middleware';
import { notFound } from '../../lib/errors';
import type { AppContext } from '../../lib/context';
import { UnitIdSchema } from '../../../shared/api/units';
import { Unit } from '../../db/models/unit';
import type { IndicatorView } from '../../../shared/realtime/envelope';
import { issueSwitchToken, revokeSwitchToken, switchSheet, unitOfSwitchToken } from './service';

const origin = (req: Request) => `${req.protocol}://${req.get('host') ?? '127.0.0.1'}`;

/** Admin: issue, revoke, print. Mounted behind the token check at /api/switch-pages. */
export function switchAdminRoutes(ctx: AppContext, onRevoke: (unitId: string) => void) {
  const r = Router();
  r.use(requirePermission('switch.manage'));
  r.get('/', async (req, res) => {
    const depot = z.string().trim().min(1).max(120).optional().parse(req.query.depot);
    res.json(await switchSheet(ctx.sequelize, origin(req), depot));
  });
  r.post('/:unitId', async (req, res) => {
    const issued = await issueSwitchToken(ctx.sequelize, req.user!, UnitIdSchema.parse(req.params.unitId));
    onRevoke(issued.unitId); // pages opened with the old link stop
    res.status(201).json({ ...issued, url: `${origin(req)}${issued.path}` });
  });
  r.delete('/:unitId', async (req, res) => {
    const unitId = UnitIdSchema.parse(req.params.unitId);
    await revokeSwitchToken(ctx.sequelize, req.user!, unitId);
    onRevoke(unitId);
    res.status(204).end();
  });
  return r;
}

/** No sign-in: the page beside the switch reads one unit's hold or clear with its token. */
export function switchPublicRoutes(ctx: AppContext, indicatorOf: (unitId: string) => IndicatorView) {
  const r = Router();
  r.get('/:token', async (req, res) => {
    const unitId = await unitOfSwitchToken(ctx.sequelize, req.params.token);
    if (!unitId) throw notFound('Switch page');
    const unit = await Unit.findByPk(unitId);
    if (!unit) throw notFound('Switch page');
    res.set('Cache-Control', 'no-store');
    res.json({ unit: { id: unit.id, name: unit.name, depot: unit.depot, purgeSeconds: unit.purgeSeconds }, indicator: indicatorOf(unit.id), sentAt: new Date().toISOString() });
  });
  return r;
}
