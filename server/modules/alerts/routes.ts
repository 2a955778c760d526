import { Router } from 'express';
import { z } from 'zod';
import { requirePermission } from '../../lib/middleware';
import type { AppContext } from '../../lib/context';
import type { AlertView } from '../../../shared/realtime/envelope';
import { UnitIdSchema } from '../../../shared/api/units';
import { handleAlert, listAlerts } from './service';

const Query = z.object({
  status: z.enum(['open', 'acknowledged', 'resolved', 'active']).optional(),
  unitId: UnitIdSchema.optional(),
  limit: z.coerce.number().int().min(1).max(5000).default(500),
});
const Body = z.object({ comment: z.string().trim().max(2000).optional() }).strict();
const Id = z.object({ id: z.coerce.number().int().positive() });

export function alertRoutes(ctx: AppContext, publish: (a: AlertView) => void) {
  const r = Router();
  r.get('/', requirePermission('alerts.read'), async (req, res) => {
    res.json(await listAlerts(ctx.sequelize, Query.parse(req.query)));
  });
  for (const action of ['acknowledge', 'resolve'] as const) {
    r.post(`/:id/${action}`, requirePermission('alerts.handle'), async (req, res) => {
      const { id } = Id.parse(req.params);
      const alert = await handleAlert(ctx.sequelize, req.user!, id, action, Body.parse(req.body ?? {}).comment || undefined);
      publish(alert);
      res.json(alert);
    });
  }
  return r;
}
