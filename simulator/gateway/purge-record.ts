import type { KeyOffTruth } from '../truth/truth-schema';
import type { Evidence } from './outbox';

/** A key-off purge as it unfolds: what physically happens, and whether the service will be told. */
export interface OpenPurge {
  truth: Omit<KeyOffTruth, 'expectedOutcome'>;
  boot: number;
  keyOffTs: number;
  /** C = key-off + purge time, gateway clock (ms) and true time. */
  cTs: number;
  cTrue: number;
  /** Set once a message that settles the episode (same boot, or the next boot's record) is made. */
  evidence: Evidence;
  evidenceOpen: boolean;
  physicalDone: boolean;
}

export function finalizeKeyOff(p: OpenPurge): KeyOffTruth {
  return { ...p.truth, expectedOutcome: p.evidence.observed ? p.truth.outcome : 'undetermined' };
}

/** Protocol rule 5: does the next boot's `prevShutdown` settle a purge that its own boot left open? */
export function recordSettles(prev: { ts: string; cause: string } | null, cTs: number): boolean {
  if (prev === null) return false;
  if (Date.parse(prev.ts) >= cTs) return true;
  return prev.cause === 'supply-lost' || prev.cause === 'sleep';
}
