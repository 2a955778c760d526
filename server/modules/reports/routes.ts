import { Router } from 'express';
import type { AppContext } from '../../lib/context';
import { requirePermission } from '../../lib/middleware';
import { ReportQuerySchema } from '../../../shared/api/reports';
import { weeklyReport } from './service';

export function reportRoutes(ctx: AppContext) {
  const r = Router();
  r.get('/weekly', requirePermission('reports.read'), async (req, res) => {
    res.json(await weeklyReport(ctx.sequelize, ReportQuerySchema.parse(req.query)));
  });
  return r;
}
