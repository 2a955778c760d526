// Protocol: unit state to indicator. keyOn -> dark; purging and interrupted -> hold; safeToIsolate and
// isolated -> clear; noContact -> nothing new.
import type { UnitStateName } from '../api/units';

export type IndicatorState = 'hold' | 'clear' | 'dark';

export function indicatorFor(state: UnitStateName | null): IndicatorState | null {
  switch (state) {
    case 'keyOn':
      return 'dark';
    case 'purging':
    case 'interrupted':
      return 'hold';
    case 'safeToIsolate':
    case 'isolated':
      return 'clear';
    default:
      return null;
  }
}
