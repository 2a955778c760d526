// Time helpers. The simulator works in epoch milliseconds of true (simulated) time; gateways
// stamp messages with their own, slightly drifting clocks.
export const SECOND = 1000;
export const MINUTE = 60 * SECOND;
export const HOUR = 60 * MINUTE;
export const DAY = 24 * HOUR;

/** The protocol's timestamp format: ISO 8601 UTC with milliseconds. */
export function iso(ms: number): string {
  return new Date(Math.round(ms)).toISOString();
}

export function parseIso(text: string): number {
  const ms = Date.parse(text);
  if (Number.isNaN(ms)) throw new Error(`not a date and time: ${text}`);
  return ms;
}

/** Whole UTC days since the epoch. The invented depots all keep UTC as their local time. */
export const dayIndexOf = (ms: number): number => Math.floor(ms / DAY);
export const dayStart = (dayIndex: number): number => dayIndex * DAY;
/** 0 = Sunday … 6 = Saturday. */
export const weekdayOf = (dayIndex: number): number => new Date(dayStart(dayIndex)).getUTCDay();
export const hourOfDay = (ms: number): number => (((ms % DAY) + DAY) % DAY) / HOUR;
