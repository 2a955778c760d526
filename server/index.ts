// The service on its own: needs DATABASE_URL (npm start provides one). config -> db -> broker -> ingest -> http.
import 'dotenv/config';
import { setFlagsFromString } from 'node:v8';
import { loadConfig } from './config';
import { startService } from './service';
import { logger } from './lib/logger';

const log = logger('main');

async function main() {
  const config = loadConfig();
  // Memory over a little CPU: the heap grows by this share over what survived the last full collection.
  if (config.HEAP_GROWTH_PERCENT > 0) setFlagsFromString(`--heap-growing-percent=${config.HEAP_GROWTH_PERCENT}`);
  const service = await startService(config, { staticDir: 'dist' });
  const stop = async (signal: string) => {
    log.info({ signal }, 'stopping');
    await service.close().catch((err) => log.error({ err }, 'error while stopping'));
    process.exit(0);
  };
  process.once('SIGINT', () => void stop('SIGINT'));
  process.once('SIGTERM', () => void stop('SIGTERM'));
}

main().catch((err) => {
  log.fatal({ err }, 'could not start');
  process.exit(1);
});
