import type { Episode } from '../types';

export const OUTCOME_LABELS: Record<Episode['outcome'], string> = {
  pending: 'Purge running',
  completed: 'Purge completed',
  interrupted: 'Purge interrupted',
  resumed: 'Purge cut short by key on',
  undetermined: 'Outcome unknown',
};

/** How the purge was settled, in plain words; the loss threshold comes from the unit's profile. */
export function settledByWords(e: Pick<Episode, 'settledBy'>, lossThresholdV?: number): string {
  switch (e.settledBy) {
    case 'powerHeld':
      return 'power held to the end';
    case 'ecmAsleep':
      return 'controller went to sleep early';
    case 'supplyLost':
      return 'supply lost';
    case 'lowVoltage':
      return lossThresholdV === undefined ? 'voltage fell under the loss threshold' : `voltage fell under ${lossThresholdV.toFixed(1)} V`;
    case 'bootRecord':
      return "settled by the gateway's restart record";
    case 'keyOn':
      return 'key turned on again';
    case null:
      return 'not settled yet';
  }
}
