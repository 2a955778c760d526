// Start-up in one readable order: db -> ingest -> broker -> http -> live feed. Used by server/index.ts, tests and the benchmark.
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Config } from './config';
import { connectDb, migrate } from './db/index';
import { configureLogger, logger } from './lib/logger';
import { resolveJwtSecret } from './lib/jwt-secret';
import type { AppContext } from './lib/context';
import { createApp } from './app';
import { ensureFirstAdmin } from './modules/users/service';
import { checkGatewayCredential } from './modules/gateways/credentials';
import { createIngest } from './ingest/ingest';
import { createBroker, type BrokerHandle } from '../broker/create-broker';
import { episodeRoutes } from './modules/episodes/routes';
import { faultRoutes } from './modules/faults/routes';

export interface ServiceOptions {
  /** The built client to serve; none in API-only tests. */
  staticDir?: string;
  /** The wall clock, for tests that drive time. */
  wallNow?: () => number;
}

export interface Service {
  port: number;
  mqttPort: number;
  ctx: AppContext;
  ingest: ReturnType<typeof createIngest>;
  broker: BrokerHandle;
  close(): Promise<void>;
}

export async function startService(config: Config, opts: ServiceOptions = {}): Promise<Service> {
  configureLogger(config.LOG_LEVEL);
  const log = logger('service');
  if (!config.DATABASE_URL) throw new Error('DATABASE_URL is not set: start through `npm start`, which runs PostgreSQL for you');

  const db = await connectDb(config.DATABASE_URL, { poolMax: 10 });
  await migrate(db.sequelize);
  if (await ensureFirstAdmin(config.ADMIN_EMAIL, config.ADMIN_PASSWORD)) log.info({ email: config.ADMIN_EMAIL }, 'first admin created');

  const ingest = createIngest({ sequelize: db.sequelize, log: logger('ingest'), batchMax: config.INGEST_BATCH_MAX, batchMs: config.INGEST_BATCH_MS, wallNow: opts.wallNow });
  await ingest.start();

  const broker = await createBroker({
    host: config.MQTT_HOST,
    port: config.MQTT_PORT,
    log: logger('broker'),
    checkCredential: async (username, password) => ({ ok: await checkGatewayCredential(username, password) }),
    accept: ingest.accept,
  });

  const ctx: AppContext = {
    config,
    sequelize: db.sequelize,
    jwtSecret: resolveJwtSecret(config.JWT_SECRET, config.DATA_DIR),
    health: [
      { name: 'db', check: async () => (await db.sequelize.query('SELECT 1'), true) },
      { name: 'broker', check: async () => !broker.broker.closed },
    ],
    fleet: {
      unit: (id) => ingest.book.view(id),
      unitChanged: async (id) => {
        await ingest.directory.load();
        await ingest.book.refreshProfile(id);
        await ingest.rejudge(id);
      },
      gatewayRevoked: async (id) => {
        await ingest.directory.refresh(id);
        broker.revoke(id);
      },
      gatewayConnected: (id) => broker.isConnected(id),
    },
  };

  const app = createApp(ctx, {
    staticDir: opts.staticDir,
    routes: [
      ['/episodes', episodeRoutes()],
      ['/faults', faultRoutes()],
    ],
  });
  const http: Server = createServer(app);
  await new Promise<void>((res, rej) => {
    http.once('error', rej);
    http.listen(config.PORT, config.HOST, () => res());
  });
  const port = (http.address() as AddressInfo).port;
  log.info({ port }, 'web server listening');

  return {
    port,
    mqttPort: broker.port,
    ctx,
    ingest,
    broker,
    async close() {
      await new Promise<void>((res) => http.close(() => res()));
      http.closeAllConnections?.();
      await broker.close();
      await ingest.stop();
      await db.close();
    },
  };
}
