import { Router } from 'express';
import { requirePermission } from '../../lib/middleware';
import { FaultQuerySchema } from '../../../shared/api/history';
import { listFaults } from './service';
import { presentFault } from './presenter';

export function faultRoutes() {
  const r = Router();
  r.get('/', requirePermission('faults.read'), async (req, res) => {
    res.json((await listFaults(FaultQuerySchema.parse(req.query))).map(presentFault));
  });
  return r;
}
