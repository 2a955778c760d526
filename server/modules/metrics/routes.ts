import { Router } from 'express';
import { requirePermission } from '../../lib/middleware';

/** Admin: the ingest's and the broker's counters, for operations and the benchmark. */
export function metricsRoutes(read: () => Record<string, unknown>) {
  const r = Router();
  r.get('/', requirePermission('audit.read'), (_req, res) => {
    res.json(read());
  });
  return r;
}
