import { DEF_FREEZE_POINT_C } from '../../shared/protocol/limits';
import type { Episode, FreezeBand, UnitEvent } from './types';
import { comparePositions } from './positions';
import type { JudgedEpisode } from './judge-episodes';

// Freeze exposure of an interrupted purge: the DEF left in the dosing lines was not pumped back to the
// tank, so the lines stay full until the next completed purge. AUS 32 (DEF) freezes at about -11 °C
// (ISO 22241-1). A frozen line is a matter for the vehicle manufacturer's thaw and inspection procedure;
// these bands only say how urgently someone should look, they do not say the system is undamaged.
//
// The band is set by the lowest ambient known from the key-off until the next completed purge. The
// readings under-state the real low: an isolated gateway is silent, so the coldest hours of a parked
// night usually go unobserved, and exposed lines can cool below the air on a clear, still night.

/** Observed air at or below the freezing point: the DEF left in the lines has probably frozen. */
export const FROZEN_AT_OR_BELOW_C = DEF_FREEZE_POINT_C;
/**
 * 4 K above the freezing point: about 2 K for an ambient sensor's tolerance and its placement near a
 * warm engine bay (from memory), and 2 K for the unobserved low while silent and for radiative cooling
 * of exposed lines below air temperature (from memory). Wind only speeds the lines toward air
 * temperature; it does not take them below it, so it adds no margin of its own, only less time.
 */
export const AT_RISK_AT_OR_BELOW_C = DEF_FREEZE_POINT_C + 4;
/**
 * Near or below 0 °C (2 K margin for the sensor): freezing nights are possible, the unobserved low
 * may be well below the readings at isolation and at the next start (from memory). Worth a look.
 */
export const WATCH_AT_OR_BELOW_C = 2;

/** The band of the lowest known ambient; null when no ambient was reported at all (unknown, not safe). */
export function freezeBand(lowestAmbientC: number | null): FreezeBand | null {
  if (lowestAmbientC === null) return null;
  if (!Number.isFinite(lowestAmbientC)) throw new RangeError(`lowest ambient must be a finite °C, got ${lowestAmbientC}`);
  if (lowestAmbientC <= FROZEN_AT_OR_BELOW_C) return 'frozen';
  if (lowestAmbientC <= AT_RISK_AT_OR_BELOW_C) return 'atRisk';
  if (lowestAmbientC <= WATCH_AT_OR_BELOW_C) return 'watch';
  return 'none';
}

interface FreezeFigures {
  lowest: number | null;
  nextKeyOnAt: number | null;
}

/**
 * Folds ordered[from..] into an interrupted episode's figures: the lowest ambient of the samples up to
 * and including index `end` (the next completed purge's key-off, or the last event), and the first key-on
 * sample's time if none is known yet.
 */
function foldFreeze(f: FreezeFigures, ordered: readonly UnitEvent[], from: number, end: number): FreezeFigures {
  let { lowest, nextKeyOnAt } = f;
  for (let i = from; i < ordered.length; i++) {
    const e = ordered[i];
    if (e.kind !== 'telemetry') continue;
    if (nextKeyOnAt === null && e.key === 'on') nextKeyOnAt = e.ts;
    if (i <= end && e.ambientC !== null && (lowest === null || e.ambientC < lowest)) lowest = e.ambientC;
    if (i >= end && nextKeyOnAt !== null) break;
  }
  return { lowest, nextKeyOnAt };
}

function setFigures(episode: Episode, f: FreezeFigures): Episode {
  episode.minAmbientAfterC = f.lowest;
  episode.freezeExposure = freezeBand(f.lowest);
  episode.nextKeyOnAt = f.nextKeyOnAt;
  return episode;
}

/**
 * Fills minAmbientAfterC, freezeExposure and nextKeyOnAt on each interrupted episode (in place).
 * The lowest ambient takes the ambient at key-off and every sample after the key-off, up to the key-off
 * of the unit's next completed purge (the purge that empties the lines again). nextKeyOnAt is the first
 * key-on sample after the key-off: none can come between key-off and the interruption, or the episode
 * would have been resumed, so it is the first key-on after endedAt (protocol rule 10).
 */
export function fillFreezeExposure(judged: JudgedEpisode[], ordered: readonly UnitEvent[]): void {
  judged.forEach((j, n) => {
    const episode = j.episode;
    if (episode.outcome !== 'interrupted') return;
    const nextCompleted = judged.slice(n + 1).find((later) => later.episode.outcome === 'completed');
    const end = nextCompleted ? nextCompleted.keyOffIndex : ordered.length - 1;
    setFigures(episode, foldFreeze({ lowest: episode.ambientC, nextKeyOnAt: null }, ordered, j.keyOffIndex + 1, end));
  });
}

/**
 * The interrupted episodes carried in a judging window's context (their lines still wet, their key-offs
 * before the window), as new objects with the window's samples folded in, by the same rule as
 * fillFreezeExposure: up to the key-off of the first completed purge among the window's episodes.
 * Their figures so far stand for the samples before the window, so none of those need be kept.
 */
export function carryFreezeExposure(wet: readonly Episode[], judged: readonly JudgedEpisode[], ordered: readonly UnitEvent[]): Episode[] {
  return wet.map((w) => {
    const nextCompleted = judged.find((j) => j.episode.outcome === 'completed' && comparePositions(j.episode.keyOff, w.keyOff) > 0);
    const end = nextCompleted ? nextCompleted.keyOffIndex : ordered.length - 1;
    let from = 0;
    while (from < ordered.length && comparePositions(ordered[from], w.keyOff) <= 0) from++;
    return setFigures({ ...w }, foldFreeze({ lowest: w.minAmbientAfterC, nextKeyOnAt: w.nextKeyOnAt }, ordered, from, end));
  });
}

/**
 * Of episodes in key-off order, those whose lines are still wet: interrupted, with no completed purge
 * after them among the episodes. (`episodeOf` reads the episode of an item, for lists of stored ones.)
 */
export function stillWet<T>(items: readonly T[], episodeOf: (item: T) => Episode): T[] {
  const wet: T[] = [];
  for (let i = items.length - 1; i >= 0 && episodeOf(items[i]).outcome !== 'completed'; i--) {
    if (episodeOf(items[i]).outcome === 'interrupted') wet.unshift(items[i]);
  }
  return wet;
}

/**
 * Folds messages that arrived late, before the judging window, into the carried interrupted episodes
 * they come after (new objects). Any completed purge after a carried episode lies in the window, so a
 * message before the window is always before the one that closes its figures. The first key-on is
 * taken by time (the figures keep no position for it); within a boot, time follows the sequence.
 */
export function foldLateFreezeExposure(wet: readonly Episode[], late: readonly UnitEvent[]): Episode[] {
  return wet.map((w) => {
    const f: FreezeFigures = { lowest: w.minAmbientAfterC, nextKeyOnAt: w.nextKeyOnAt };
    for (const e of late) {
      if (e.kind !== 'telemetry' || comparePositions(e, w.keyOff) <= 0) continue;
      if (e.key === 'on' && (f.nextKeyOnAt === null || e.ts < f.nextKeyOnAt)) f.nextKeyOnAt = e.ts;
      if (e.ambientC !== null && (f.lowest === null || e.ambientC < f.lowest)) f.lowest = e.ambientC;
    }
    return setFigures({ ...w }, f);
  });
}

/**
 * An interrupted episode judged again from part of the history (one old boot, window.ts): its freeze
 * figures are the union of what that part shows and what was stored (which saw the other parts).
 */
export function mergeFreezeExposure(partial: Episode, stored: Episode): Episode {
  if (partial.outcome !== 'interrupted' || stored.outcome !== 'interrupted') return partial;
  const low = [partial.minAmbientAfterC, stored.minAmbientAfterC].filter((v): v is number => v !== null);
  const keyOns = [partial.nextKeyOnAt, stored.nextKeyOnAt].filter((v): v is number => v !== null);
  return setFigures({ ...partial }, { lowest: low.length ? Math.min(...low) : null, nextKeyOnAt: keyOns.length ? Math.min(...keyOns) : null });
}
