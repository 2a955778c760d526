import { DEF_FREEZE_POINT_C } from '../../shared/protocol/limits';
import type { FreezeBand, UnitEvent } from './types';
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
    let lowest = episode.ambientC;
    let nextKeyOnAt: number | null = null;
    for (let i = j.keyOffIndex + 1; i < ordered.length; i++) {
      const e = ordered[i];
      if (e.kind !== 'telemetry') continue;
      if (nextKeyOnAt === null && e.key === 'on') nextKeyOnAt = e.ts;
      if (i <= end && e.ambientC !== null && (lowest === null || e.ambientC < lowest)) lowest = e.ambientC;
      if (i >= end && nextKeyOnAt !== null) break;
    }
    episode.minAmbientAfterC = lowest;
    episode.freezeExposure = freezeBand(lowest);
    episode.nextKeyOnAt = nextKeyOnAt;
  });
}
