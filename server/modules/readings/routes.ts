import { Router } from 'express';
import { z } from 'zod';
import { requirePermission } from '../../lib/middleware';
import type { AppContext } from '../../lib/context';
import { UnitIdSchema } from '../../../shared/api/units';
import { badRequest } from '../../lib/errors';
import { getUnit } from '../units/service';
import { readings, timeline } from './service';

const DAY = 24 * 3600_000;
const Range = z.object({
  from: z.string().refine((s) => !Number.isNaN(Date.parse(s)), 'must be an ISO 8601 time').optional(),
  to: z.string().refine((s) => !Number.isNaN(Date.parse(s)), 'must be an ISO 8601 time').optional(),
  maxPoints: z.coerce.number().int().min(10).max(20_000).default(3000),
});

function range(query: unknown) {
  const q = Range.parse(query);
  const to = q.to ? new Date(q.to) : new Date(Date.now() + 60_000);
  const from = q.from ? new Date(q.from) : new Date(to.getTime() - DAY);
  if (from >= to) throw badRequest('from must be before to');
  if (to.getTime() - from.getTime() > 93 * DAY) throw badRequest('a range is at most 93 days');
  return { from, to, maxPoints: q.maxPoints };
}

/** Mounted at /api/units: /:id/readings and /:id/timeline. */
export function readingRoutes(ctx: AppContext) {
  const r = Router();
  r.get('/:id/readings', requirePermission('units.read'), async (req, res) => {
    const unit = await getUnit(UnitIdSchema.parse(req.params.id));
    res.json(await readings(ctx.sequelize, { unitId: unit.id, ...range(req.query) }));
  });
  r.get('/:id/timeline', requirePermission('units.read'), async (req, res) => {
    const unit = await getUnit(UnitIdSchema.parse(req.params.id));
    res.json(await timeline(ctx.sequelize, { unitId: unit.id, ...range(req.query) }));
  });
  return r;
}
