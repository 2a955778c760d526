// The judgement engine's inputs and outputs. Times are epoch milliseconds (event time, from `ts`).
import type { ShutdownCause } from '../../shared/protocol/messages';

export interface Profile {
  purgeSeconds: number;
  lossThresholdV: number;
}

/** Where a message stands in a unit's history: gateway ordinal (a unit's replaced gateway starts anew), boot, seq. */
export interface EventPosition {
  /** 0 for the unit's first gateway, 1 for its replacement, and so on. */
  stream: number;
  boot: number;
  seq: number;
}

export interface TelemetryEvent extends EventPosition {
  kind: 'telemetry';
  ts: number;
  key: 'on' | 'off';
  supplyV: number;
  ambientC: number | null;
  ecmAwake: boolean;
}

export interface PowerEvent extends EventPosition {
  kind: 'power';
  ts: number;
  event: 'supply-lost' | 'supply-restored' | 'boot';
  supplyV: number;
  prevShutdown: { ts: number; cause: ShutdownCause } | null;
}

/** A `can` message takes a (boot, seq) too; the engine only needs to know it was seen (no gap). */
export interface CanEvent extends EventPosition {
  kind: 'can';
  ts: number;
}

export type UnitEvent = TelemetryEvent | PowerEvent | CanEvent;

export type Outcome = 'pending' | 'completed' | 'interrupted' | 'resumed' | 'undetermined';
export type SettledBy = 'powerHeld' | 'ecmAsleep' | 'supplyLost' | 'lowVoltage' | 'bootRecord' | 'keyOn';
export type UnitStateName = 'keyOn' | 'purging' | 'safeToIsolate' | 'isolated' | 'interrupted' | 'noContact';

export interface Episode {
  /** The key-off sample that opened the episode: its identity across re-judgements. */
  keyOff: EventPosition & { ts: number };
  purgeSeconds: number;
  lossThresholdV: number;
  outcome: Outcome;
  settledBy: SettledBy | null;
  /** ms; null while pending or undetermined. */
  endedAt: number | null;
  /** Seconds into the purge at the loss, millisecond precision; interrupted only. */
  secondsIntoPurge: number | null;
  /** Ambient at key-off (or the nearest earlier sample with one), °C. */
  ambientC: number | null;
  /** The message that settled it, null for none. */
  evidence: EventPosition | null;
  /** No message between key-off and the settling evidence is missing: no late message can change it. */
  final: boolean;
  /** Interrupted only: lowest ambient seen from the interruption until the unit's next completed purge (°C). */
  minAmbientAfterC: number | null;
  /** Interrupted only: the freeze-exposure band (see freeze.ts). */
  freezeExposure: FreezeBand | null;
  /** Interrupted only: time of the first key-on sample after endedAt (for fault linking), ms. */
  nextKeyOnAt: number | null;
}

export type FreezeBand = 'none' | 'watch' | 'atRisk' | 'frozen';

export interface UnitState {
  state: UnitStateName;
  /** Event time that entered the state, ms. */
  since: number;
  /** purging only: ceil of the seconds to C, at least 0. */
  purgeRemainingS: number | null;
}

export interface Judgement {
  episodes: Episode[];
  state: UnitState | null;
}

/**
 * The unit-state fold before any state rule of time (silence, C + 30 s) is applied. Carried from one
 * judging window to the next (see window.ts). `offUnknown`: key off with no judged purge and the
 * controller still awake, shown as noContact. `undetermined`: the latest episode is undetermined.
 */
export type BaseStateName = 'keyOn' | 'safeToIsolate' | 'isolated' | 'interrupted' | 'undetermined' | 'offUnknown';

export interface BaseState {
  name: BaseStateName;
  since: number;
}

/** What a judging window needs to know of the events before it (window.ts computes it). */
export interface JudgeContext {
  /** The state fold just before the window's first event; null when nothing was known. */
  state: BaseState | null;
  /** The last telemetry sample before the window that carried an ambient, for an episode's ambientC. */
  lastAmbient: { ts: number; ambientC: number } | null;
  /**
   * Interrupted episodes before the window whose lines are still wet (no completed purge after them
   * yet), with their freeze figures so far: the window's samples fold into them (freeze.ts), so the
   * samples before the window need not be kept. Absent or empty: none.
   */
  wet?: Episode[];
}

export interface JudgeInput {
  profile: Profile;
  events: UnitEvent[];
  previousEpisodes?: Episode[];
  /** The judging clock, epoch ms (event time of the service, never read from the system inside the engine). */
  now: number;
  /** Null or absent when the events start at the unit's first message. */
  context?: JudgeContext | null;
}
