// `npm start`: PostgreSQL in DATA_DIR (unless DATABASE_URL names one), the service with the built client,
// and with DEMO=on the demo fleet's simulator. Ctrl-C or SIGTERM stops all of it, the database last.
import 'dotenv/config';
import { spawn, type ChildProcess } from 'node:child_process';
import { join, resolve } from 'node:path';
import { loadConfig } from '../server/config';
import { startService, type Service } from '../server/service';
import { PostgresMissingError, startLocalPostgres, type LocalPostgres } from './lib/local-postgres';

const say = (msg: string) => process.stdout.write(`${msg}\n`);

async function main() {
  const env = { ...process.env };
  const first = loadConfig(env);
  let pg: LocalPostgres | null = null;
  let service: Service | null = null;
  let sim: ChildProcess | null = null;
  let stopping = false;
  const stop = async (code: number) => {
    if (stopping) return;
    stopping = true;
    say('\nStopping Afterwatch…');
    if (sim && sim.exitCode === null) sim.kill('SIGTERM');
    await service?.close().catch(() => {});
    await pg?.stop().catch(() => {});
    process.exit(code);
  };
  process.once('SIGINT', () => void stop(0));
  process.once('SIGTERM', () => void stop(0));

  if (!first.DATABASE_URL) {
    try {
      pg = await startLocalPostgres({ dataDir: first.DATA_DIR, log: (m) => say(`[db] ${m}`) });
    } catch (err) {
      if (err instanceof PostgresMissingError) {
        say(`\n${err.message}\n`);
        process.exit(1);
      }
      throw err;
    }
    env.DATABASE_URL = pg.url;
  }
  const config = loadConfig(env);
  service = await startService(config, { staticDir: resolve('dist') });
  const url = `http://${config.HOST === '0.0.0.0' ? '127.0.0.1' : config.HOST}:${service.port}`;
  if (config.DEMO) {
    sim = spawn(process.execPath, [join('node_modules', 'tsx', 'dist', 'cli.mjs'), 'simulator/cli.ts', '--scenario', 'demo', '--speed', '1'], {
      stdio: ['ignore', 'inherit', 'inherit'],
      env: { ...env, API_URL: url, MQTT_URL: `mqtt://${config.MQTT_HOST}:${service.mqttPort}`, DATA_DIR: config.DATA_DIR, ADMIN_EMAIL: config.ADMIN_EMAIL, ADMIN_PASSWORD: config.ADMIN_PASSWORD },
    });
    sim.on('exit', (code) => {
      if (!stopping && code) say(`[demo] the demo simulator stopped (exit ${code}); the service keeps running`);
    });
  }
  say('');
  say(`Afterwatch is running: open ${url}`);
  say(`Sign in as ${config.ADMIN_EMAIL} with the password from ADMIN_PASSWORD${env.ADMIN_PASSWORD ? '' : ` (default: ${config.ADMIN_PASSWORD})`}.`);
  say(`Gateways connect to mqtt://${config.MQTT_HOST}:${service.mqttPort}. ${config.DEMO ? 'The demo fleet is live.' : 'DEMO=off: no demo fleet.'} Ctrl-C stops.`);
}

main().catch((err) => {
  process.stderr.write(`Afterwatch could not start: ${err instanceof Error ? err.stack ?? err.message : String(err)}\n`);
  process.exit(1);
});
