import type { ExpectedOutcome, KeyOffTruth, Truth } from './truth-schema';

/** The service's view of one episode, as GET /api/episodes gives it (fields the comparison needs). */
export interface FoundEpisode {
  id: string | number;
  unitId: string;
  keyOffAt: string;
  outcome: 'pending' | 'completed' | 'interrupted' | 'resumed' | 'undetermined';
  secondsIntoPurge: number | null;
}

export type VerdictRow = { expected: number; found: number; missed: number; wronglyFound: number };
export const VERDICT_OUTCOMES = ['completed', 'interrupted', 'resumed', 'undetermined', 'pending'] as const;
export type VerdictOutcome = (typeof VERDICT_OUTCOMES)[number];

export interface EpisodeVerdict {
  rows: Record<VerdictOutcome, VerdictRow>;
  misses: { truth: KeyOffTruth; found: FoundEpisode | null; reason: string }[];
  falseFindings: { found: FoundEpisode; truth: KeyOffTruth | null; reason: string }[];
  /** service episode id → the truth key-off it matched */
  matched: Map<string, KeyOffTruth>;
  ok: boolean;
}

export interface CompareOptions {
  /** How far apart the service's keyOffAt and the truth's may be (ms); both come from the gateway's clock. */
  keyOffToleranceMs?: number;
  /** Tolerance on secondsIntoPurge (s). */
  secondsTolerance?: number;
}

const emptyRows = (): Record<VerdictOutcome, VerdictRow> =>
  Object.fromEntries(VERDICT_OUTCOMES.map((o) => [o, { expected: 0, found: 0, missed: 0, wronglyFound: 0 }])) as Record<VerdictOutcome, VerdictRow>;

/**
 * Compares the service's episodes with the ground truth, per outcome: a truth key-off is found
 * when the service has an episode of the same unit at the same key-off with the same outcome
 * (and, for interrupted, the same seconds into the purge); otherwise it is missed, and whatever the
 * service said instead is wrongly found. A service episode with no key-off in the truth is wrongly
 * found. Only the truth's units and time span are considered. Pure.
 */
export function compareEpisodes(truth: Truth, episodes: readonly FoundEpisode[], opts: CompareOptions = {}): EpisodeVerdict {
  const tol = opts.keyOffToleranceMs ?? 2000;
  const secTol = opts.secondsTolerance ?? 0.5;
  const units = new Set(truth.fleet.map((u) => u.unitId));
  const from = Date.parse(truth.start) - tol;
  const lastKeyOff = Math.max(Date.parse(truth.end), ...truth.keyOffs.map((k) => Date.parse(k.keyOffAt)));
  const to = lastKeyOff + tol;
  const byUnit = new Map<string, FoundEpisode[]>();
  for (const e of episodes) {
    const t = Date.parse(e.keyOffAt);
    if (!units.has(e.unitId) || t < from || t > to) continue;
    const list = byUnit.get(e.unitId) ?? [];
    list.push(e);
    byUnit.set(e.unitId, list);
  }
  const rows = emptyRows();
  const misses: EpisodeVerdict['misses'] = [];
  const falseFindings: EpisodeVerdict['falseFindings'] = [];
  const used = new Set<FoundEpisode>();
  const matched = new Map<string, KeyOffTruth>();
  for (const k of truth.keyOffs) {
    const expected: ExpectedOutcome = k.expectedOutcome;
    rows[expected].expected++;
    const t = Date.parse(k.keyOffAt);
    let best: FoundEpisode | null = null;
    for (const e of byUnit.get(k.unitId) ?? []) {
      if (used.has(e)) continue;
      const d = Math.abs(Date.parse(e.keyOffAt) - t);
      if (d <= tol && (best === null || d < Math.abs(Date.parse(best.keyOffAt) - t))) best = e;
    }
    if (best === null) {
      rows[expected].missed++;
      misses.push({ truth: k, found: null, reason: 'no episode at this key-off' });
      continue;
    }
    used.add(best);
    matched.set(String(best.id), k);
    const sameOutcome = best.outcome === expected;
    const secondsOk = expected !== 'interrupted' || (best.secondsIntoPurge !== null && k.secondsIntoPurge !== null && Math.abs(best.secondsIntoPurge - k.secondsIntoPurge) <= secTol);
    if (sameOutcome && secondsOk) {
      rows[expected].found++;
      continue;
    }
    rows[expected].missed++;
    rows[best.outcome].wronglyFound++;
    const reason = sameOutcome
      ? `secondsIntoPurge ${best.secondsIntoPurge} instead of ${k.secondsIntoPurge}`
      : `found ${best.outcome} instead of ${expected}`;
    misses.push({ truth: k, found: best, reason });
    falseFindings.push({ found: best, truth: k, reason });
  }
  for (const list of byUnit.values()) {
    for (const e of list) {
      if (used.has(e)) continue;
      rows[e.outcome].wronglyFound++;
      falseFindings.push({ found: e, truth: null, reason: 'no such key-off happened' });
    }
  }
  return { rows, misses, falseFindings, matched, ok: misses.length === 0 && falseFindings.length === 0 };
}
