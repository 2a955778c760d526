import { compareValues, sortRows, type SortDirection, type SortState, type SortValue } from '../../../lib/sort';
import { UNIT_STATES, type UnitStateName } from '../../../lib/unit-state';
import type { Unit } from '../types';

export const UNIT_SORT_KEYS = [
  'id', 'name', 'depot', 'systemVoltage', 'purgeSeconds', 'gatewayId', 'state', 'timeInState', 'lastSupplyV', 'lastAmbientC',
] as const;
export type UnitSortKey = (typeof UNIT_SORT_KEYS)[number];

/** `none` selects units with no data yet. */
export type StateFilter = UnitStateName | 'none';

export interface UnitFilters {
  depot: string | null;
  state: StateFilter | null;
  query: string;
  sort: SortState<UnitSortKey>;
}

export const DEFAULT_UNIT_SORT: SortState<UnitSortKey> = { key: 'state', direction: 'asc' };

// Sorting by state puts what needs a person first: an interrupted purge, then running purges,
// then lost contact; quiet and finished states after. A design choice of this project.
const STATE_ORDER: Record<UnitStateName, number> = {
  interrupted: 0, purging: 1, noContact: 2, safeToIsolate: 3, keyOn: 4, isolated: 5,
};

function sortValue(unit: Unit, key: UnitSortKey): SortValue {
  switch (key) {
    case 'state':
      return unit.state === null ? null : STATE_ORDER[unit.state];
    case 'timeInState': {
      // Longer in state = earlier stateSince; ascending shows the shortest first.
      const since = unit.stateSince ? Date.parse(unit.stateSince) : NaN;
      return Number.isNaN(since) ? null : -since;
    }
    default:
      return unit[key];
  }
}

export function matchesQuery(unit: Unit, query: string): boolean {
  const q = query.trim().toLowerCase();
  if (!q) return true;
  return unit.id.toLowerCase().includes(q) || unit.name.toLowerCase().includes(q);
}

/** The units a person asked for, in the order they asked; ties fall back to the unit id. */
export function filterAndSortUnits(units: readonly Unit[], f: UnitFilters): Unit[] {
  const kept = units.filter(
    (u) =>
      (f.depot === null || u.depot === f.depot) &&
      (f.state === null || (f.state === 'none' ? u.state === null : u.state === f.state)) &&
      matchesQuery(u, f.query),
  );
  const byId = sortRows(kept, (u) => u.id, 'asc');
  return sortRows(byId, (u) => sortValue(u, f.sort.key), f.sort.direction);
}

export function depotsOf(units: readonly Unit[]): string[] {
  return [...new Set(units.map((u) => u.depot))].sort((a, b) => compareValues(a, b, 'asc'));
}

const isSortKey = (v: string | null): v is UnitSortKey => v !== null && (UNIT_SORT_KEYS as readonly string[]).includes(v);
const isStateFilter = (v: string | null): v is StateFilter =>
  v === 'none' || (v !== null && (UNIT_STATES as readonly string[]).includes(v));

/** Filters from the address bar (`?depot=&state=&q=&sort=&dir=`), so a wall screen can be bookmarked. */
export function readUnitFilters(params: URLSearchParams): UnitFilters {
  const sortKey = params.get('sort');
  const dir = params.get('dir');
  const state = params.get('state');
  return {
    depot: params.get('depot') || null,
    state: isStateFilter(state) ? state : null,
    query: params.get('q') ?? '',
    sort: isSortKey(sortKey)
      ? { key: sortKey, direction: (dir === 'desc' ? 'desc' : 'asc') as SortDirection }
      : DEFAULT_UNIT_SORT,
  };
}

export function writeUnitFilters(f: UnitFilters): URLSearchParams {
  const p = new URLSearchParams();
  if (f.depot) p.set('depot', f.depot);
  if (f.state) p.set('state', f.state);
  if (f.query) p.set('q', f.query);
  if (f.sort.key !== DEFAULT_UNIT_SORT.key || f.sort.direction !== DEFAULT_UNIT_SORT.direction) {
    p.set('sort', f.sort.key);
    p.set('dir', f.sort.direction);
  }
  return p;
}
