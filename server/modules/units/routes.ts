import { Router } from 'express';
import { requirePermission } from '../../lib/middleware';
import type { AppContext } from '../../lib/context';
import { UnitCreateSchema, UnitIdSchema, UnitUpdateSchema } from '../../../shared/api/units';
import { createUnit, getUnit, listUnits, updateUnit } from './service';
import { presentUnit } from './presenter';

export function unitRoutes(ctx: AppContext) {
  const r = Router();
  const present = (u: Awaited<ReturnType<typeof getUnit>>) => presentUnit(u, ctx.fleet.unit(u.id));
  r.get('/', requirePermission('units.read'), async (_req, res) => {
    res.json((await listUnits()).map(present));
  });
  r.get('/:id', requirePermission('units.read'), async (req, res) => {
    res.json(present(await getUnit(UnitIdSchema.parse(req.params.id))));
  });
  r.post('/', requirePermission('units.write'), async (req, res) => {
    const unit = await createUnit(req.user!, UnitCreateSchema.parse(req.body));
    await ctx.fleet.unitChanged?.(unit.id);
    res.status(201).json(present(unit));
  });
  r.patch('/:id', requirePermission('units.write'), async (req, res) => {
    const unit = await updateUnit(req.user!, UnitIdSchema.parse(req.params.id), UnitUpdateSchema.parse(req.body));
    await ctx.fleet.unitChanged?.(unit.id);
    res.json(present(unit));
  });
  return r;
}
