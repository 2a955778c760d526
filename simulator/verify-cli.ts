// npm run sim:verify -- <truth.json> [--api http://127.0.0.1:3000] [--faults] [--wait 60]
// Compares the service's findings (GET /api/episodes, optionally /api/faults) with the ground truth
// a simulator run wrote; exit code 1 on any miss or false finding, 2 on bad usage.
import { config as loadDotenv } from 'dotenv';
import { z } from 'zod';
import { AdminEnvSchema, defaultApiUrl, describeIssues, splitArgs } from './cli/args';
import { ApiClient } from './net/api-client';
import { compareEpisodes } from './truth/compare';
import { compareFaults } from './truth/compare-faults';
import { readTruth } from './truth/truth-file';
import { fetchFaults, fetchSettledEpisodes, formatVerdict } from './truth/verify';

const USAGE = 'usage: npm run sim:verify -- <truth.json> [--api http://127.0.0.1:3000] [--faults] [--wait seconds]';

function fail(message: string, code: number): never {
  process.stderr.write(`${message}\n`);
  process.exit(code);
}

async function main(): Promise<number> {
  loadDotenv({ quiet: true });
  const { named, positional } = splitArgs(process.argv.slice(2));
  if (named.help) fail(USAGE, 0);
  if (positional.length !== 1) fail(`give exactly one truth file\n${USAGE}`, 2);
  const parsed = z
    .object({
      api: z.string().url('--api must be a URL').default(defaultApiUrl(process.env)),
      faults: z.literal(true).optional(),
      wait: z.string().regex(/^\d+$/, "must be whole seconds").transform(Number).default(300),
    })
    .strict()
    .safeParse(named);
  if (!parsed.success) fail(`${describeIssues(parsed.error)}\n${USAGE}`, 2);
  const admin = AdminEnvSchema.safeParse(process.env);
  if (!admin.success) fail(admin.error.issues.map((i) => i.message).join('\n'), 2);
  const truth = await readTruth(positional[0]);
  const api = new ApiClient(parsed.data.api);
  await api.login(admin.data.ADMIN_EMAIL, admin.data.ADMIN_PASSWORD);
  const episodes = await fetchSettledEpisodes(api, truth, parsed.data.wait * 1000, (n) => process.stderr.write(`${n} episode(s) still pending, waiting ...\n`));
  const v = compareEpisodes(truth, episodes);
  const f = parsed.data.faults ? compareFaults(truth, await fetchFaults(api, truth), v) : null;
  process.stdout.write(`${truth.scenario} ${truth.start} to ${truth.end}, ${truth.fleet.length} units, seed ${truth.seed}\n\n${formatVerdict(v, f)}\n`);
  return v.ok && (f?.ok ?? true) ? 0 : 1;
}

main().then(
  (code) => process.exit(code),
  (err: Error) => fail(`verify: ${err.message}`, 1),
);
