// Start-up in one readable order: db -> ingest -> broker -> http -> live feed. Used by server/index.ts, tests and the benchmark.
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Config } from './config';
import { connectDb, migrate } from './db/index';
import { maintainPartitions } from './db/partitions';
import { configureLogger, logger } from './lib/logger';
import { resolveJwtSecret } from './lib/jwt-secret';
import type { AppContext } from './lib/context';
import { createApp } from './app';
import { ensureFirstAdmin } from './modules/users/service';
import { createIngest } from './ingest/ingest';
import { openBrokerLink, type BrokerLink } from './broker-link';
import { episodeRoutes } from './modules/episodes/routes';
import { faultRoutes } from './modules/faults/routes';
import { alertRoutes } from './modules/alerts/routes';
import { startAlertEngine } from './modules/alerts/engine';
import { getAlert } from './modules/alerts/service';
import { switchAdminRoutes, switchPublicRoutes } from './modules/switch/routes';
import { unitOfSwitchToken } from './modules/switch/service';
import { readingRoutes } from './modules/readings/routes';
import { metricsRoutes } from './modules/metrics/routes';
import { historyRoutes } from './modules/history/routes';
import { reportRoutes } from './modules/reports/routes';
import { driverRoutes } from './modules/drivers/routes';
import { batteryRoutes } from './modules/battery/routes';
import { recordStatus } from './modules/readings/service';
import { startIndicators } from './realtime/indicator';
import { indicatorView, startLiveFeed } from './realtime/live-feed';
import { startPeerRelay } from './realtime/peer-relay';
import { verifyToken } from './lib/middleware';
import { loadActiveUser } from './modules/auth/service';
import type { AlertView } from '../shared/realtime/envelope';
import { workOrderRoutes } from './modules/work-orders/routes';
import { rosterRoutes } from './modules/roster/routes';
import { mailRoutes } from './modules/mail/routes';
import { startMail } from './modules/mail/start';
import { depotRoutes, forecastRoutes } from './modules/forecast/routes';
import { startForecastPoller } from './modules/forecast/start';
import { startForecastFake } from './dev-fakes/forecast-fake';

/** The advisory lock (two-key form) under which workers write the external broker's files. */
const BROKER_FILES_LOCK = [0x4166, 1] as const;

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
  broker: BrokerLink;
  alertsIdle(): Promise<void>;
  /** Alert mails queued so far have been sent (or failed and were logged). */
  mailIdle(): Promise<void>;
  /** Fetches every located depot's forecast now and raises freeze warnings. */
  refreshForecasts: ReturnType<typeof startForecastPoller>['refresh'];
  /** The local forecast fake, when FORECAST_URL is not set (tests set its temperatures). */
  forecastFake: Awaited<ReturnType<typeof startForecastFake>> | null;
  close(): Promise<void>;
}

export async function startService(config: Config, opts: ServiceOptions = {}): Promise<Service> {
  configureLogger(config.LOG_LEVEL);
  const log = logger('service');
  if (!config.DATABASE_URL) throw new Error('DATABASE_URL is not set: start through `npm start`, which runs PostgreSQL for you');

  const db = await connectDb(config.DATABASE_URL, { poolMax: 10 });
  await migrate(db.sequelize);
  const partitions = () => maintainPartitions(db.sequelize, { now: new Date(), retentionDays: config.MESSAGE_RETENTION_DAYS });
  await partitions();
  const partitionTimer = setInterval(() => partitions().catch((err) => log.warn({ err }, 'partition upkeep failed')), 6 * 3600_000);
  partitionTimer.unref();
  if (await ensureFirstAdmin(config.ADMIN_EMAIL, config.ADMIN_PASSWORD)) log.info({ email: config.ADMIN_EMAIL }, 'first admin created');

  const ingest = createIngest({
    sequelize: db.sequelize,
    log: logger('ingest'),
    batchMax: config.INGEST_BATCH_MAX,
    batchMs: config.INGEST_BATCH_MS,
    maxBacklog: config.INGEST_MAX_BACKLOG,
    wallNow: opts.wallNow,
    shared: Boolean(config.MQTT_URL),
    onStatus: (gatewayId, unitId, status) => {
      recordStatus(db.sequelize, gatewayId, unitId, status.state, status.boot ?? null).catch((err) => log.warn({ err, gatewayId }, 'status not recorded'));
    },
  });
  // Behind an external broker other workers judge units too: their judgements reach this worker's
  // views and live feed through PostgreSQL (listening before the ingest loads its memory).
  const relay = config.MQTT_URL
    ? await startPeerRelay({ databaseUrl: config.DATABASE_URL, workerId: config.INGEST_WORKER_ID, events: ingest.events, book: ingest.book, loadAlert: (id) => getAlert(db.sequelize, id), log: logger('relay'), wallNow: opts.wallNow })
    : null;
  const unitView = (unitId: string) => (relay ? relay.view(unitId) : ingest.book.view(unitId));
  await ingest.start();

  // Behind an external broker the workers take turns writing its password and ACL files (broker-link.ts).
  // The two-key form of the advisory lock: a keyspace apart from the units' one-key locks (ingest.ts).
  const filesLock = <T>(fn: () => Promise<T>) =>
    db.sequelize.transaction(async (t) => {
      await db.sequelize.query('SELECT pg_advisory_xact_lock($1, $2)', { bind: [BROKER_FILES_LOCK[0], BROKER_FILES_LOCK[1]], transaction: t });
      return fn();
    });
  const broker = await openBrokerLink(config, ingest.accept, logger('broker'), filesLock);

  const ctx: AppContext = {
    config,
    sequelize: db.sequelize,
    jwtSecret: resolveJwtSecret(config.JWT_SECRET, config.DATA_DIR),
    health: [
      { name: 'db', check: async () => (await db.sequelize.query('SELECT 1'), true) },
      { name: 'broker', check: async () => broker.healthy() },
    ],
    fleet: {
      unit: unitView,
      unitChanged: async (id) => {
        await ingest.directory.load();
        await broker.gatewaysChanged();
        await ingest.book.refreshProfile(id);
        await ingest.rejudge(id);
        indicators.resend(id);
      },
      gatewayRevoked: async (id) => {
        await ingest.directory.refresh(id);
        await broker.gatewaysChanged(id);
      },
      gatewayConnected: (id) => broker.isConnected(id),
    },
  };

  // The live feed is created after the HTTP server; routes publish through this late-bound reference.
  let feed: ReturnType<typeof startLiveFeed> | null = null;
  const alertHooks: Array<(a: AlertView) => void> = [];
  const publishAlert = (a: AlertView) => {
    feed?.broadcast({ type: 'alert', alert: a });
    for (const hook of alertHooks) hook(a);
  };
  // E-mail (the local SMTP fake unless SMTP_URL is set) hears every published alert.
  const mail = await startMail({ config, sequelize: db.sequelize, log: logger('mail') });
  alertHooks.push((a) => mail.onAlert(a));
  // Behind an external broker the other workers' boards hear this worker's alerts too (not their mail: sent once, here).
  if (relay) alertHooks.push((a) => relay.relayAlert(a));
  const forecastFake = config.FORECAST_URL ? null : await startForecastFake({ host: '127.0.0.1', port: config.FORECAST_FAKE_PORT });
  const forecast = startForecastPoller({
    sequelize: db.sequelize,
    baseUrl: config.FORECAST_URL ?? forecastFake!.url,
    log: logger('forecast'),
    unitState: (unitId) => unitView(unitId).state,
    publish: publishAlert,
    events: ingest.events,
    pollMs: config.FORECAST_POLL_MINUTES * 60_000,
  });
  const depotOf = (unitId: string) => (relay ? relay.depotOf(unitId) : ingest.book.peek(unitId)?.profile.depot ?? '');
  const app = createApp(ctx, {
    staticDir: opts.staticDir,
    publicRoutes: [['/switch', switchPublicRoutes(ctx, (unitId) => indicatorView(unitView(unitId)))]],
    routes: [
      ['/units', readingRoutes(ctx)],
      ['/episodes', episodeRoutes()],
      ['/faults', faultRoutes()],
      ['/alerts', alertRoutes(ctx, publishAlert)],
      ['/metrics', metricsRoutes(() => ({ worker: config.INGEST_WORKER_ID, ingest: ingest.counters, judgeErrors: ingest.judgeErrors.count, backlog: ingest.backlog, ingestPausedSince: ingest.pausedSince, broker: broker.counters, liveClients: feed?.peers() ?? 0, relay: relay ? { connected: relay.connected(), ...relay.counters } : null }))],
      ['/switch-pages', switchAdminRoutes(ctx, (unitId) => feed?.dropSwitch(unitId))],
      ['/work-orders', workOrderRoutes(ctx)],
      ['/roster', rosterRoutes(ctx)],
      ['/mail', mailRoutes(ctx, () => mail)],
      ['/depots', depotRoutes(ctx)],
      ['/forecast', forecastRoutes(ctx, () => forecast.refresh())],
      ['/history', historyRoutes(ctx)],
      ['/reports', reportRoutes(ctx)],
      ['/drivers', driverRoutes(ctx)],
      ['/battery', batteryRoutes(ctx)],
    ],
  });
  const http: Server = createServer(app);
  feed = startLiveFeed({
    http,
    events: ingest.events,
    peers: relay?.peers,
    log: logger('live'),
    verifyUser: async (token) => {
      const user = await loadActiveUser(verifyToken(token, ctx.jwtSecret).id);
      if (!user) throw new Error('inactive user');
      return user;
    },
    switchUnit: (token) => unitOfSwitchToken(db.sequelize, token),
    view: unitView,
    depotOf,
  });
  const alerts = startAlertEngine({ sequelize: db.sequelize, events: ingest.events, log: logger('alerts'), escalateAfterMs: config.ALERT_ESCALATE_MINUTES * 60_000, publish: publishAlert });
  const indicatorLog = logger('indicator');
  const indicators = startIndicators({
    events: ingest.events,
    gatewayOf: (unitId) => ingest.directory.activeGatewayOf(unitId),
    units: () => ingest.book.unitIds(),
    // Behind an external broker the newer of this worker's and the other workers' judgements.
    view: unitView,
    publish: (topic, payload) => broker.publish(topic, payload, { qos: 1, retain: true }),
    log: indicatorLog,
  });
  // Protocol: the lights are retained by the broker; one that restarted may have lost them, so they go again.
  broker.onReconnect(() => {
    indicatorLog.info('broker back: every indicator re-published');
    indicators.republishAll();
  });
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
    alertsIdle: () => alerts.idle(),
    mailIdle: () => mail.idle(),
    refreshForecasts: () => forecast.refresh(),
    forecastFake,
    async close() {
      clearInterval(partitionTimer);
      feed?.close();
      alerts.stop();
      await forecast.stop();
      await mail.close();
      await forecastFake?.close();
      await new Promise<void>((res) => http.close(() => res()));
      http.closeAllConnections?.();
      await broker.close();
      await ingest.stop();
      await relay?.close();
      await db.close();
    },
  };
}
