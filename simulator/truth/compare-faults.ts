import type { EpisodeVerdict } from './compare';
import type { Truth } from './truth-schema';

export interface FoundFault {
  unitId: string;
  at: string;
  sourceAddress: number;
  spn: number;
  fmi: number;
  episodeId: string | number | null;
}

export interface FaultVerdict {
  expected: number;
  found: number;
  missed: number;
  wronglyFound: number;
  /** of the found ones: linked to the wrong episode, or linked/unlinked against the truth */
  wrongLink: number;
  problems: string[];
  ok: boolean;
}

/** Compares decoded faults with the truth: same unit, source, SPN and FMI within `toleranceMs`; then the episode link. Pure. */
export function compareFaults(truth: Truth, faults: readonly FoundFault[], episodes: EpisodeVerdict, toleranceMs = 1500): FaultVerdict {
  const units = new Set(truth.fleet.map((u) => u.unitId));
  const from = Date.parse(truth.start);
  const to = Date.parse(truth.end) + 3 * 3600_000;
  const pool = faults.filter((f) => units.has(f.unitId) && Date.parse(f.at) >= from && Date.parse(f.at) <= to);
  const used = new Set<FoundFault>();
  const v: FaultVerdict = { expected: truth.faults.length, found: 0, missed: 0, wronglyFound: 0, wrongLink: 0, problems: [], ok: true };
  for (const f of truth.faults) {
    const t = Date.parse(f.at);
    const hit = pool.find((p) => !used.has(p) && p.unitId === f.unitId && p.sourceAddress === f.sourceAddress && p.spn === f.spn && p.fmi === f.fmi && Math.abs(Date.parse(p.at) - t) <= toleranceMs);
    if (!hit) {
      v.missed++;
      v.problems.push(`missed fault ${f.unitId} SPN ${f.spn} FMI ${f.fmi} at ${f.at}`);
      continue;
    }
    used.add(hit);
    v.found++;
    const linkedTo = hit.episodeId === null ? null : episodes.matched.get(String(hit.episodeId))?.keyOffAt ?? `episode ${hit.episodeId}`;
    if (linkedTo !== f.linkedKeyOffAt) {
      v.wrongLink++;
      v.problems.push(`fault ${f.unitId} SPN ${f.spn} at ${f.at}: linked to ${linkedTo ?? 'nothing'}, truth says ${f.linkedKeyOffAt ?? 'nothing'}`);
    }
  }
  for (const p of pool) {
    if (used.has(p)) continue;
    v.wronglyFound++;
    v.problems.push(`fault ${p.unitId} SPN ${p.spn} FMI ${p.fmi} at ${p.at} did not happen`);
  }
  v.ok = v.missed === 0 && v.wronglyFound === 0 && v.wrongLink === 0;
  return v;
}
