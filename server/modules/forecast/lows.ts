// Pure: the lowest forecast temperature in the next hours, and whether a parked unit must be warned.
import { DEF_FREEZE_POINT_C } from '../../../shared/protocol/limits';
import type { HourlyTemperature } from './client';

export const LOOKAHEAD_HOURS = 48;

export interface ForecastLow {
  lowC: number;
  lowAt: Date;
  /** The first hour at or under the DEF freezing point, if any: the time to act by. */
  freezeFrom: Date | null;
  hours: HourlyTemperature[];
}

/** The hours from the current hour to now + 48 h; null when the forecast has none of them. */
export function lowAhead(hourly: HourlyTemperature[], now: Date, hoursAhead = LOOKAHEAD_HOURS): ForecastLow | null {
  const from = Math.floor(now.getTime() / 3600_000) * 3600_000;
  const to = now.getTime() + hoursAhead * 3600_000;
  const hours = hourly.filter((h) => h.at.getTime() >= from && h.at.getTime() <= to).sort((a, b) => a.at.getTime() - b.at.getTime());
  if (!hours.length) return null;
  const low = hours.reduce((m, h) => (h.c < m.c ? h : m));
  // ISO 22241-1: AUS 32 (DEF) freezes at about -11 °C; "at or under" counts the freezing point itself.
  const freezing = hours.find((h) => h.c <= DEF_FREEZE_POINT_C) ?? null;
  return { lowC: low.c, lowAt: low.at, freezeFrom: freezing ? freezing.at : null, hours };
}

export type ParkedState = string | null;
export type EpisodeOutcome = 'pending' | 'completed' | 'interrupted' | 'resumed' | 'undetermined';

/**
 * A unit is warned when it is parked (key off: any known state but keyOn), its latest purge is
 * unsettled (pending, undetermined) or interrupted, and its depot's forecast reaches the DEF freezing point.
 */
export function needsForecastWarning(state: ParkedState, latestOutcome: EpisodeOutcome | null, low: ForecastLow | null): boolean {
  if (state === null || state === 'keyOn') return false;
  if (latestOutcome !== 'pending' && latestOutcome !== 'undetermined' && latestOutcome !== 'interrupted') return false;
  return low !== null && low.freezeFrom !== null;
}
