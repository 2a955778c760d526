import type { AlertView } from '../../../../shared/realtime/envelope';

export const KIND_LABELS: Record<AlertView['kind'], string> = {
  interruptedPurge: 'Purge interrupted',
  undeterminedCold: 'Purge unconfirmed in freezing weather',
  contactLost: 'Contact lost during a purge',
  forecastFreeze: 'Freezing weather ahead with an unfinished purge',
};

export const STATUS_LABELS: Record<AlertView['status'], string> = {
  open: 'Open',
  acknowledged: 'Acknowledged',
  resolved: 'Resolved',
};

/** What to do about the unit: the common practice for a DEF purge that did not finish. */
export const ALERT_ACTION =
  "Restore battery power, key on, then key off and wait for 'Safe to isolate' before opening the isolator.";

export const ALERT_CAUTION =
  "This is common practice, not the manufacturer's instruction: where the vehicle or engine manufacturer's procedure says otherwise, follow it, and have a frozen or damaged DEF system inspected under their thaw procedure.";

export function secondsIntoWords(s: number | null): string {
  return s === null ? 'unknown' : `${Math.round(s)} s`;
}
