// npm run sim -- --scenario <name> --units N --speed X --seed S [--api URL] [--mqtt URL] [--truth out.json]
// npm run sim -- --replay <candump.log> [--telemetry <file.jsonl>] --gateway <id> [--unit <id>] [--speed X]
import { config as loadDotenv } from 'dotenv';
import { join } from 'node:path';
import { AdminEnvSchema, describeIssues, simArgsSchema, splitArgs } from './cli/args';
import { runReplay } from './replay/run-replay';
import { runDemo } from './run-demo';
import { runScenarioDetailed } from './run-scenario';
import { SCENARIOS } from './scenario/scenarios';

const USAGE = `usage:
  npm run sim -- --scenario <${Object.keys(SCENARIOS).join('|')}> [--units N] [--speed X|max] [--seed S]
                 [--api ${'http://127.0.0.1:3000'}] [--mqtt mqtt://127.0.0.1:1883] [--truth out.json] [--start ISO] [--data-dir .data]
  npm run sim -- --replay <candump.log> [--telemetry <file.jsonl>] --gateway <id> [--unit <id>] [--speed X|max]
scenarios:
${Object.values(SCENARIOS).map((s) => `  ${s.name.padEnd(14)} ${s.summary}`).join('\n')}
The admin's ADMIN_EMAIL and ADMIN_PASSWORD come from the environment (or .env).`;

function fail(message: string, code: number): never {
  process.stderr.write(`${message}\n`);
  process.exit(code);
}

async function main(): Promise<void> {
  loadDotenv({ quiet: true });
  const { named, positional } = splitArgs(process.argv.slice(2));
  if (named.help || positional.includes('help')) fail(USAGE, 0);
  if (positional.length > 0) fail(`unexpected argument ${positional[0]}\n\n${USAGE}`, 2);
  const parsed = simArgsSchema(process.env).safeParse(named);
  if (!parsed.success) fail(`${describeIssues(parsed.error)}\n\n${USAGE}`, 2);
  const a = parsed.data;
  const admin = AdminEnvSchema.safeParse(process.env);
  if (!admin.success) fail(admin.error.issues.map((i) => i.message).join('\n'), 2);
  const common = { apiUrl: a.api, mqttUrl: a.mqtt, adminEmail: admin.data.ADMIN_EMAIL, adminPassword: admin.data.ADMIN_PASSWORD };
  const progress = !a.quiet && process.stderr.isTTY === true;

  if (a.replay !== undefined) {
    const summary = await runReplay({ ...common, candumpPath: a.replay, telemetryPath: a.telemetry, gatewayId: a.gateway!, unitId: a.unit, speed: a.speed, dataDir: a['data-dir'], seed: a.seed, progress });
    process.stderr.write(`${summary}\n`);
    return;
  }
  if (a.scenario === 'demo') {
    if (a.speed === 'max') fail('the demo runs forever: give it a number for --speed (1 = real time)', 2);
    let stop: () => void = () => {};
    const stopped = new Promise<void>((r) => (stop = r));
    process.once('SIGINT', stop);
    process.once('SIGTERM', stop);
    await runDemo({ ...common, units: a.units, seed: a.seed, speed: a.speed, dataDir: a['data-dir'], truthPath: a.truth, stopped, log: (l) => process.stderr.write(`${l}\n`) });
    return;
  }
  const scenario = a.scenario!;
  const r = await runScenarioDetailed({
    ...common, scenario, units: a.units, seed: a.seed, speed: a.speed, start: a.start,
    dataDir: a['data-dir'], truthPath: a.truth ?? join(a['data-dir'], `sim-truth-${scenario}.json`), progress,
  });
  if (!progress) process.stderr.write(`${r.summary}\n`);
  process.stderr.write(`verify with: npm run sim:verify -- ${r.truthPath}\n`);
}

main().then(
  () => process.exit(0),
  (err: Error) => fail(`simulator: ${err.message}`, 1),
);
