// What the ingest keeps in memory per unit: the judging window (events, context), the stored episodes
// inside it, the DM1 tracker, the last readings and the state. The database is the source of truth;
// all of this is rebuilt from it at start-up.
import type { Episode, EventPosition, JudgeContext, Profile, UnitEvent, UnitState } from '../detection/types';
import type { JudgingWindow } from '../detection/window';
import { comparePositions, positionKey } from '../detection/positions';
import { Dm1Tracker } from '../../shared/j1939/dm1-tracker';

export interface StoredEpisode {
  id: number;
  episode: Episode;
}

export interface UnitProfile extends Profile {
  unitId: string;
  depot: string;
  linkSpns: number[] | null;
}

export interface UnitMemory {
  profile: UnitProfile;
  /** Events with position >= windowStart, ordered. */
  events: UnitEvent[];
  windowStart: EventPosition | null;
  context: JudgeContext | null;
  /** Stored episodes with key-off >= windowStart, and the still-wet ones the context carries, by position key. */
  episodes: Map<string, StoredEpisode>;
  state: UnitState | null;
  /** Latest event time seen, and the wall time at which it arrived: the unit's clock runs on from there. */
  lastTs: number | null;
  lastArrival: number;
  lastTelemetry: { position: EventPosition; supplyV: number; ambientC: number | null } | null;
  dm1: Dm1Tracker;
  lastCan: EventPosition | null;
  /** units.judged_version this memory reflects: with several workers, a different one means another worker judged the unit since. */
  version: number;
}

export function newMemory(profile: UnitProfile, wallNow: number): UnitMemory {
  return {
    profile, events: [], windowStart: null, context: null, episodes: new Map(), state: null,
    lastTs: null, lastArrival: wallNow, lastTelemetry: null, dm1: new Dm1Tracker(), lastCan: null, version: 0,
  };
}

/** A copy to work on inside a transaction; swapped in only after commit. The DM1 tracker is copied on write (unit-faults.ts). */
export function cloneMemory(m: UnitMemory): UnitMemory {
  // Field by field, not a spread: made for every unit of every batch, and a literal of known shape is cheaper.
  return {
    profile: m.profile, events: m.events.slice(), windowStart: m.windowStart, context: m.context, episodes: new Map(m.episodes), state: m.state,
    lastTs: m.lastTs, lastArrival: m.lastArrival, lastTelemetry: m.lastTelemetry, dm1: m.dm1, lastCan: m.lastCan, version: m.version,
  };
}

/**
 * The unit's clock: event time, running on in wall time since the latest message arrived. Live, it is
 * the gateway's clock; in a fast replay it follows the replayed events, so "C + 30 s" means the same.
 */
export function unitNow(m: UnitMemory, wallNow: number): number {
  return m.lastTs === null ? wallNow : m.lastTs + Math.max(0, wallNow - m.lastArrival);
}

/**
 * Keeps only what the next judgement needs (window.ts): the events and stored episodes from the window's
 * start on, the still-wet episodes its context carries, and the context.
 */
export function applyWindow(m: UnitMemory, win: JudgingWindow, ordered: UnitEvent[]) {
  m.windowStart = win.start;
  m.context = win.context;
  m.events = win.start ? ordered.filter((e) => comparePositions(e, win.start!) >= 0) : [];
  const wet = new Set((win.context.wet ?? []).map((e) => positionKey(e.keyOff)));
  for (const [key, s] of m.episodes) if (win.start && comparePositions(s.episode.keyOff, win.start) < 0 && !wet.has(key)) m.episodes.delete(key);
}
