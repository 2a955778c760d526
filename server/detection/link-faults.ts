import { FAULT_LINK_WINDOW_MS } from '../../shared/protocol/limits';
import type { Episode } from './types';
import { comparePositions } from './positions';

export interface FaultAt {
  at: number;
  spn: number;
}

// SAE J1939-73: an SPN is a 19-bit number.
const MAX_SPN = 524_287;

function assertSpn(spn: number, where: string): void {
  if (!Number.isInteger(spn) || spn < 0 || spn > MAX_SPN) throw new RangeError(`${where}: SPN must be an integer 0..${MAX_SPN}, got ${spn}`);
}

/**
 * Protocol rule 10: a fault whose `at` lies from the first key-on sample after an interrupted episode's
 * endedAt to 10 minutes after it, both inclusive, is linked to that episode; where two qualify, the most
 * recent episode (the later key-off). `linkSpns` null or absent: every SPN may link; a list (even an
 * empty one) narrows linking to exactly those SPNs. Returns, per fault, the index into `episodes` or null.
 * Episodes must carry nextKeyOnAt (judgeUnit fills it on interrupted episodes).
 */
export function linkFaults(episodes: readonly Episode[], faults: readonly FaultAt[], linkSpns?: readonly number[] | null): (number | null)[] {
  linkSpns?.forEach((spn, i) => assertSpn(spn, `linkSpns[${i}]`));
  const allowed = linkSpns ? new Set(linkSpns) : null;
  const candidates = episodes
    .map((episode, index) => ({ episode, index }))
    .filter(({ episode }) => episode.outcome === 'interrupted' && episode.nextKeyOnAt !== null);
  return faults.map((fault, i) => {
    if (!Number.isFinite(fault.at)) throw new RangeError(`faults[${i}].at must be a finite epoch ms, got ${fault.at}`);
    assertSpn(fault.spn, `faults[${i}]`);
    if (allowed && !allowed.has(fault.spn)) return null;
    let best: { index: number; episode: Episode } | null = null;
    for (const c of candidates) {
      const from = c.episode.nextKeyOnAt as number;
      if (fault.at < from || fault.at > from + FAULT_LINK_WINDOW_MS) continue;
      // Most recent: the later key-off in event order (stream, boot, seq).
      if (!best || comparePositions(c.episode.keyOff, best.episode.keyOff) > 0) best = c;
    }
    return best ? best.index : null;
  });
}

