import { Router } from 'express';
import { requirePermission } from '../../lib/middleware';

/** Admin: the ingest's and the broker's counters, for operations and the benchmark. */
export function metricsRoutes(read: () => Record<string, unknown>) {
  const r = Router();
  r.get('/', requirePermission('audit.read'), (_req, res) => {
    const m = process.memoryUsage();
    const mb = (n: number) => Math.round(n / 1048576);
    res.json({ ...read(), memoryMb: { rss: mb(m.rss), heapUsed: mb(m.heapUsed), heapTotal: mb(m.heapTotal), external: mb(m.external), arrayBuffers: mb(m.arrayBuffers) } });
  });
  return r;
}
