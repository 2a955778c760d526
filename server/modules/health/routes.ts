import { Router } from 'express';
import type { AppContext } from '../../lib/context';

export function healthRoutes(ctx: AppContext) {
  const r = Router();
  r.get('/', async (_req, res) => {
    const results = await Promise.all(ctx.health.map(async (p) => [p.name, await p.check().catch(() => false)] as const));
    const parts = Object.fromEntries(results.map(([n, ok]) => [n, ok ? 'ok' : 'error']));
    const ok = results.every(([, v]) => v);
    res.status(ok ? 200 : 503).json({ status: ok ? 'ok' : 'error', db: parts.db ?? 'error', broker: parts.broker ?? 'error' });
  });
  return r;
}
