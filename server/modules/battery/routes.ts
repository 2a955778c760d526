import { Router } from 'express';
import type { AppContext } from '../../lib/context';
import { requirePermission } from '../../lib/middleware';
import { BatteryQuerySchema, BatteryUnitParamSchema } from '../../../shared/api/battery';
import { batteryOfFleet, batteryOfUnit } from './service';

export function batteryRoutes(ctx: AppContext) {
  const r = Router();
  r.get('/', requirePermission('battery.read'), async (req, res) => {
    res.json(await batteryOfFleet(ctx.sequelize, BatteryQuerySchema.parse(req.query)));
  });
  r.get('/:unitId', requirePermission('battery.read'), async (req, res) => {
    const { days } = BatteryQuerySchema.parse(req.query);
    res.json(await batteryOfUnit(ctx.sequelize, BatteryUnitParamSchema.parse(req.params.unitId), days));
  });
  return r;
}
