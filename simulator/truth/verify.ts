import type { ApiClient, ApiEpisode, ApiFault } from '../net/api-client';
import { compareEpisodes, VERDICT_OUTCOMES, type EpisodeVerdict } from './compare';
import { compareFaults, type FaultVerdict } from './compare-faults';
import type { Truth } from './truth-schema';

const sleep = (ms: number) => new Promise<void>((r) => setTimeout(r, ms));

async function mapLimited<T, R>(items: readonly T[], limit: number, fn: (t: T) => Promise<R>): Promise<R[]> {
  const out: R[] = new Array(items.length);
  let next = 0;
  await Promise.all(Array.from({ length: Math.min(limit, items.length) }, async () => {
    while (next < items.length) {
      const i = next++;
      out[i] = await fn(items[i]);
    }
  }));
  return out;
}

/** Reads the service's episodes for the truth's units and span (GET /api/episodes per unit). */
export async function fetchEpisodes(api: ApiClient, truth: Truth): Promise<ApiEpisode[]> {
  const from = new Date(Date.parse(truth.start) - 60_000).toISOString();
  const to = new Date(Date.parse(truth.end) + 3 * 3600_000).toISOString();
  const lists = await mapLimited(truth.fleet, 8, (u) => api.listEpisodes({ unitId: u.unitId, from, to }));
  return lists.flat();
}

export async function fetchFaults(api: ApiClient, truth: Truth): Promise<ApiFault[]> {
  const from = truth.start;
  const to = new Date(Date.parse(truth.end) + 3 * 3600_000).toISOString();
  const lists = await mapLimited(truth.fleet, 8, (u) => api.listFaults({ unitId: u.unitId, from, to }));
  return lists.flat();
}

/** Reads until no episode of the run is pending any more, or `waitMs` has passed. */
export async function fetchSettledEpisodes(api: ApiClient, truth: Truth, waitMs: number, onWait: (pending: number) => void): Promise<ApiEpisode[]> {
  const until = Date.now() + waitMs;
  for (;;) {
    const eps = await fetchEpisodes(api, truth);
    const pending = eps.filter((e) => e.outcome === 'pending').length;
    if (pending === 0 || Date.now() >= until) return eps;
    onWait(pending);
    await sleep(2000);
  }
}

export function formatVerdict(v: EpisodeVerdict, f: FaultVerdict | null, maxLines = 20): string {
  const head = `${'outcome'.padEnd(14)}${'expected'.padStart(10)}${'found'.padStart(8)}${'missed'.padStart(8)}${'wrongly found'.padStart(15)}`;
  const rows = VERDICT_OUTCOMES.map((o) => {
    const r = v.rows[o];
    return `${o.padEnd(14)}${String(r.expected).padStart(10)}${String(r.found).padStart(8)}${String(r.missed).padStart(8)}${String(r.wronglyFound).padStart(15)}`;
  });
  const lines = [head, ...rows];
  if (f) lines.push(`${'faults'.padEnd(14)}${String(f.expected).padStart(10)}${String(f.found).padStart(8)}${String(f.missed).padStart(8)}${String(f.wronglyFound).padStart(15)}   wrong links ${f.wrongLink}`);
  const problems = [
    ...v.misses.map((m) => `missed  ${m.truth.unitId} key-off ${m.truth.keyOffAt}: expected ${m.truth.expectedOutcome}${m.truth.secondsIntoPurge !== null ? ` at ${m.truth.secondsIntoPurge} s` : ''}; ${m.reason}`),
    ...v.falseFindings.filter((x) => x.truth === null).map((x) => `wrong   ${x.found.unitId} key-off ${x.found.keyOffAt}: ${x.found.outcome}; ${x.reason}`),
    ...(f?.problems ?? []),
  ];
  if (problems.length > 0) {
    lines.push('', ...problems.slice(0, maxLines));
    if (problems.length > maxLines) lines.push(`... and ${problems.length - maxLines} more`);
  }
  const ok = v.ok && (f?.ok ?? true);
  lines.push('', ok ? 'verdict: every purge found as it happened, nothing wrongly found' : 'verdict: FAILED (misses or false findings above)');
  return lines.join('\n');
}

export { compareEpisodes, compareFaults };
