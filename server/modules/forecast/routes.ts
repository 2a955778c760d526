import { Router } from 'express';
import { z } from 'zod';
import { requirePermission } from '../../lib/middleware';
import type { AppContext } from '../../lib/context';
import { listDepots, setDepotLocation } from './depots';
import { listForecasts, listForecastWarnings, type RefreshResult } from './service';

const DepotName = z.string().trim().min(1).max(120);
const Location = z.object({ latitude: z.number().finite().min(-90).max(90), longitude: z.number().finite().min(-180).max(180) }).strict();

export function depotRoutes(ctx: AppContext) {
  const r = Router();
  r.get('/', requirePermission('depots.read'), async (_req, res) => {
    res.json(await listDepots(ctx.sequelize));
  });
  r.put('/:name', requirePermission('depots.manage'), async (req, res) => {
    const loc = Location.parse(req.body);
    res.json(await setDepotLocation(ctx.sequelize, req.user!, DepotName.parse(req.params.name), loc.latitude, loc.longitude));
  });
  return r;
}

export function forecastRoutes(ctx: AppContext, refresh: () => Promise<RefreshResult>) {
  const r = Router();
  r.get('/', requirePermission('depots.read'), async (_req, res) => {
    res.json(await listForecasts(ctx.sequelize));
  });
  r.get('/warnings', requirePermission('depots.read'), async (_req, res) => {
    res.json(await listForecastWarnings(ctx.sequelize));
  });
  r.post('/refresh', requirePermission('forecast.refresh'), async (_req, res) => {
    res.json(await refresh());
  });
  return r;
}
