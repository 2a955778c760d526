import { Router } from 'express';
import { requirePermission } from '../../lib/middleware';
import type { AppContext } from '../../lib/context';
import { ROSTER_TEMPLATE, RosterUploadSchema } from '../../../shared/api/roster';
import { commitRoster, previewRoster } from './service';

export function rosterRoutes(ctx: AppContext) {
  const r = Router();
  r.use(requirePermission('roster.import'));
  r.get('/template', (_req, res) => {
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', 'attachment; filename="fleet-roster-template.csv"');
    res.send(ROSTER_TEMPLATE);
  });
  r.post('/preview', async (req, res) => {
    res.json(await previewRoster(ctx.sequelize, RosterUploadSchema.parse(req.body).csv));
  });
  r.post('/commit', async (req, res) => {
    const result = await commitRoster(ctx.sequelize, req.user!, RosterUploadSchema.parse(req.body).csv);
    // The broker and the ingest learn the new units and credentials.
    for (const unitId of result.units) await ctx.fleet.unitChanged?.(unitId);
    res.status(201).json(result);
  });
  return r;
}
