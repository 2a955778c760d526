import { createRng } from '../core/rng';
import { HOUR, MINUTE, dayStart } from '../core/time';

export interface CoverageOptions {
  seed: string;
  /** Chance per unit and day of a long gap (minutes to hours without network). */
  longGapP: number;
  /** Chance per unit and day of a short dropout (a few minutes). */
  shortGapP: number;
}

export interface Gap {
  from: number;
  to: number;
}

/** Gaps in network coverage of one unit that start on `day`; pure in (seed, unit, day). */
export function gapsOfDay(opts: CoverageOptions, unitId: string, day: number): Gap[] {
  const rng = createRng(`${opts.seed}/coverage/${unitId}/${day}`);
  const gaps: Gap[] = [];
  if (rng.chance(opts.longGapP)) {
    const from = dayStart(day) + rng.float(0, 24) * HOUR;
    gaps.push({ from, to: from + rng.float(10 * MINUTE, 4 * HOUR) });
  }
  if (rng.chance(opts.shortGapP)) {
    const from = dayStart(day) + rng.float(0, 24) * HOUR;
    gaps.push({ from, to: from + rng.float(1 * MINUTE, 12 * MINUTE) });
  }
  return gaps.sort((a, b) => a.from - b.from);
}

/** Merges overlapping gaps and clips them to [from, to). */
export function mergeGaps(gaps: Gap[], from: number, to: number): Gap[] {
  const sorted = gaps
    .map((g) => ({ from: Math.max(g.from, from), to: Math.min(g.to, to) }))
    .filter((g) => g.to > g.from)
    .sort((a, b) => a.from - b.from);
  const out: Gap[] = [];
  for (const g of sorted) {
    const last = out[out.length - 1];
    if (last && g.from <= last.to) last.to = Math.max(last.to, g.to);
    else out.push({ ...g });
  }
  return out;
}
