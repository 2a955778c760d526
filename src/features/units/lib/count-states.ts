import { UNIT_STATES, type UnitStateName } from '../../../lib/unit-state';
import type { Unit } from '../types';

export type StateCounts = Record<UnitStateName | 'none', number>;

/** How many units are in each state; `none` counts units with no data yet. */
export function countStates(units: readonly Pick<Unit, 'state'>[]): StateCounts {
  const counts = Object.fromEntries([...UNIT_STATES, 'none'].map((s) => [s, 0])) as StateCounts;
  for (const u of units) counts[u.state ?? 'none'] += 1;
  return counts;
}
