// `npm run mosquitto:config`: writes MOSQUITTO_DIR/mosquitto.conf, passwd and acl from the gateways table,
// for running the service behind Mosquitto (README: "Scaling out"). Needs DATABASE_URL and MQTT_SERVICE_PASSWORD.
import 'dotenv/config';
import { mkdirSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { loadConfig } from '../server/config';
import { connectDb, migrate } from '../server/db/index';
import { mosquittoConf, writeMosquittoFiles } from '../server/modules/gateways/mosquitto-files';

async function main() {
  const config = loadConfig();
  if (!config.MOSQUITTO_DIR || !config.DATABASE_URL || !config.MQTT_SERVICE_PASSWORD) {
    throw new Error('set MOSQUITTO_DIR, DATABASE_URL and MQTT_SERVICE_PASSWORD');
  }
  const dir = resolve(config.MOSQUITTO_DIR);
  mkdirSync(join(dir, 'data'), { recursive: true });
  const port = config.MQTT_URL ? Number(new URL(config.MQTT_URL).port || 1883) : config.MQTT_PORT;
  writeFileSync(join(dir, 'mosquitto.conf'), mosquittoConf(dir, { host: config.MQTT_HOST, port, runAsRoot: process.getuid?.() === 0 }));
  const db = await connectDb(config.DATABASE_URL);
  await migrate(db.sequelize);
  // The gateways are let in by the first worker that has subscribed (server/modules/gateways/mosquitto-files.ts).
  const written = await writeMosquittoFiles(dir, config.MQTT_SERVICE_USERNAME, config.MQTT_SERVICE_PASSWORD, { admitGateways: false });
  await db.close();
  if (written === 'leftWhileRunning') {
    process.stdout.write(`wrote ${join(dir, 'mosquitto.conf')} (read at its next start); a Mosquitto runs from ${dir}, so passwd and acl were left to its workers\n`);
    return;
  }
  process.stdout.write(`wrote ${join(dir, 'mosquitto.conf')}, passwd and acl; start it with: mosquitto -c ${join(dir, 'mosquitto.conf')}\n`);
  process.stdout.write('gateways are admitted once a worker has subscribed: start the workers with the same settings\n');
}

main().catch((err) => {
  process.stderr.write(`${err instanceof Error ? err.message : String(err)}\n`);
  process.exit(1);
});
