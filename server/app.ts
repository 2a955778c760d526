// The Express app without listen(), so that tests drive it with supertest.
import express, { type Express } from 'express';
import { existsSync } from 'node:fs';
import { join, resolve } from 'node:path';
import type { AppContext } from './lib/context';
import { errorHandler, notFoundHandler, requireAuth } from './lib/middleware';
import { loadActiveUser } from './modules/auth/service';
import { loginRoutes, meRoutes } from './modules/auth/routes';
import { healthRoutes } from './modules/health/routes';
import { userRoutes } from './modules/users/routes';
import { unitRoutes } from './modules/units/routes';
import { gatewayRoutes } from './modules/gateways/routes';
import { auditRoutes } from './modules/audit/routes';

export interface AppExtensions {
  /** Routes that need no token (mounted before the auth check), e.g. the switch page's feed. */
  publicRoutes?: Array<[string, express.Router]>;
  /** Routes behind the token check. */
  routes?: Array<[string, express.Router]>;
  /** The built client to serve, with a fallback to index.html for client-side routes. */
  staticDir?: string;
}

export function createApp(ctx: AppContext, ext: AppExtensions = {}): Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use('/api', express.json({ limit: '1mb' }));

  app.use('/api/health', healthRoutes(ctx));
  app.use('/api/auth', loginRoutes(ctx));
  for (const [path, router] of ext.publicRoutes ?? []) app.use(`/api${path}`, router);

  const api = express.Router();
  api.use(requireAuth(ctx.jwtSecret, loadActiveUser));
  api.use('/auth', meRoutes());
  api.use('/users', userRoutes());
  api.use('/units', unitRoutes(ctx));
  api.use('/gateways', gatewayRoutes(ctx));
  api.use('/audit', auditRoutes());
  for (const [path, router] of ext.routes ?? []) api.use(path, router);
  app.use('/api', api);
  app.use('/api', notFoundHandler);

  const staticDir = ext.staticDir ? resolve(ext.staticDir) : null;
  if (staticDir && existsSync(join(staticDir, 'index.html'))) {
    app.use(express.static(staticDir, { index: false, maxAge: '1h' }));
    app.get(/^(?!\/api\/).*/, (_req, res) => res.sendFile(join(staticDir, 'index.html')));
  }
  app.use(errorHandler);
  return app;
}
