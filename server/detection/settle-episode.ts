import type { EventPosition, Outcome, PowerEvent, SettledBy, UnitEvent } from './types';
import { gapFree, positionOf, sameBoot } from './positions';

export interface Settlement {
  outcome: Exclude<Outcome, 'pending' | 'undetermined'>;
  settledBy: SettledBy;
  endedAt: number;
  secondsIntoPurge: number | null;
  evidence: EventPosition;
  /** Index in the ordered events; null for a boot record outside them (never: it is one of them). */
  evidenceIndex: number;
  final: boolean;
}

interface PurgeClock {
  keyOffTs: number;
  /** C = key-off + purge time (protocol rule 4). */
  c: number;
  lossThresholdV: number;
}

/** Seconds from key-off to the loss, kept to the millisecond (protocol rule 7). */
function secondsInto(clock: PurgeClock, at: number): number {
  return Math.round(at - clock.keyOffTs) / 1000;
}

type Verdict = Pick<Settlement, 'outcome' | 'settledBy' | 'endedAt'> | null;

/** Protocol rule 4, for one message of the same boot after the key-off; the listed order decides within a message. */
function verdictOf(event: UnitEvent, clock: PurgeClock): Verdict {
  const { c, lossThresholdV } = clock;
  const powerHeld: Verdict = { outcome: 'completed', settledBy: 'powerHeld', endedAt: c };
  if (event.kind === 'telemetry') {
    if (event.key === 'on') return event.ts < c ? { outcome: 'resumed', settledBy: 'keyOn', endedAt: event.ts } : powerHeld;
    // Any sample at or after C proves power was held until C, low or not.
    if (event.ts >= c) return powerHeld;
    if (!event.ecmAwake) return { outcome: 'completed', settledBy: 'ecmAsleep', endedAt: event.ts };
    // "Under" means strictly less than (protocol rule 2).
    if (event.supplyV < lossThresholdV) return { outcome: 'interrupted', settledBy: 'lowVoltage', endedAt: event.ts };
    return null;
  }
  if (event.kind === 'power') {
    if (event.event === 'supply-lost') {
      return event.ts < c ? { outcome: 'interrupted', settledBy: 'supplyLost', endedAt: event.ts } : powerHeld;
    }
    // A supply-restored event reports a supply reading like a sample does (a design choice).
    if (event.event === 'supply-restored') {
      if (event.ts >= c) return powerHeld;
      if (event.supplyV < lossThresholdV) return { outcome: 'interrupted', settledBy: 'lowVoltage', endedAt: event.ts };
    }
    // A `boot` event opens a boot; inside the same boot after a key-off it cannot be evidence.
    return null;
  }
  // CAN batches are not samples of the supply: they count only for gaps.
  return null;
}

/**
 * The first message of the same boot (and stream) after the key-off that settles the episode.
 * Final when no seq is missing from the key-on sample before the key-off up to that message:
 * a missing one could be an earlier key-off or an earlier settling message.
 */
export function settleFromSameBoot(
  ordered: readonly UnitEvent[],
  anchorIndex: number,
  keyOffIndex: number,
  clock: PurgeClock,
): Settlement | null {
  const keyOff = ordered[keyOffIndex];
  for (let i = keyOffIndex + 1; i < ordered.length && sameBoot(ordered[i], keyOff); i++) {
    const verdict = verdictOf(ordered[i], clock);
    if (!verdict) continue;
    return {
      ...verdict,
      secondsIntoPurge: verdict.outcome === 'interrupted' ? secondsInto(clock, verdict.endedAt) : null,
      evidence: positionOf(ordered[i]),
      evidenceIndex: i,
      final: gapFree(ordered, anchorIndex, i),
    };
  }
  return null;
}

/**
 * Protocol rule 5: the next boot's prevShutdown, where the same boot gave no evidence. A record whose
 * time lies before the key-off cannot describe a shutdown after it and is no evidence (a design choice).
 * Never final: a buffered message of the earlier boot may still arrive and outranks the record.
 */
export function settleFromBootRecord(record: PowerEvent, recordIndex: number, clock: PurgeClock): Settlement | null {
  const prev = record.prevShutdown;
  if (!prev || prev.ts < clock.keyOffTs) return null;
  const base = { settledBy: 'bootRecord' as const, evidence: positionOf(record), evidenceIndex: recordIndex, final: false };
  if (prev.ts >= clock.c || prev.cause === 'sleep') {
    // The gateway sleeps only after the controller does (protocol rule 5); endedAt is C (rule 7).
    return { ...base, outcome: 'completed', endedAt: clock.c, secondsIntoPurge: null };
  }
  if (prev.cause === 'supply-lost') {
    return { ...base, outcome: 'interrupted', endedAt: prev.ts, secondsIntoPurge: secondsInto(clock, prev.ts) };
  }
  return null;
}
