import { z } from 'zod';

// Unit states of gateway protocol v1, rule 8.
export const UNIT_STATES = ['keyOn', 'purging', 'safeToIsolate', 'isolated', 'interrupted', 'noContact'] as const;
export const UnitStateSchema = z.enum(UNIT_STATES);
export type UnitStateName = z.infer<typeof UnitStateSchema>;

/** What a person reads for each state; `null` is a unit that has sent nothing yet. */
export const STATE_LABELS: Record<UnitStateName, string> = {
  keyOn: 'Key on',
  purging: 'Purge in progress',
  safeToIsolate: 'Safe to isolate',
  isolated: 'Isolated',
  interrupted: 'Purge interrupted',
  noContact: 'No contact',
};
export const NO_DATA_LABEL = 'No data yet';

/** One line on what the state means for the person at the isolator. */
export const STATE_HINTS: Record<UnitStateName, string> = {
  keyOn: 'Ignition on; nothing to wait for.',
  purging: 'Keep battery power on until the purge ends.',
  safeToIsolate: 'The purge finished with power held.',
  isolated: 'Supply is off after a finished purge, or with none open.',
  interrupted: 'Power was lost before the purge ended; run it again.',
  noContact: 'The gateway has gone quiet; state unknown.',
};

export function stateLabel(state: UnitStateName | null): string {
  return state === null ? NO_DATA_LABEL : STATE_LABELS[state];
}
