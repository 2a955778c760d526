import { describe, expect, it } from 'vitest';
import {
  DEFAULT_UNIT_SORT,
  depotsOf,
  filterAndSortUnits,
  readUnitFilters,
  writeUnitFilters,
  type UnitFilters,
} from '../../src/features/units/lib/filter-units';
import type { Unit } from '../../src/features/units/types';

function unit(id: string, over: Partial<Unit> = {}): Unit {
  return {
    id, name: `Tractor ${id}`, depot: 'North yard', systemVoltage: 24, purgeSeconds: 120, lossThresholdV: 12,
    linkSpns: null, gatewayId: `gw-${id}`, state: 'isolated', stateSince: '2026-11-27T17:00:00.000Z',
    purgeRemainingS: null, lastSupplyV: 25.1, lastAmbientC: -3, lastSeenAt: null, ...over,
  };
}

const fleet: Unit[] = [
  unit('T-10', { state: 'safeToIsolate', depot: 'South yard', lastSupplyV: 24.6 }),
  unit('T-2', { state: 'purging', purgeRemainingS: 40, stateSince: '2026-11-27T17:05:00.000Z' }),
  unit('T-3', { state: 'interrupted', name: 'Reefer hauler', lastSupplyV: null }),
  unit('T-1', { state: null, stateSince: null, lastSupplyV: null, lastAmbientC: null }),
];
const all: UnitFilters = { depot: null, state: null, query: '', sort: DEFAULT_UNIT_SORT };
const ids = (units: Unit[]) => units.map((u) => u.id);

describe('filtering and sorting the units table', () => {
  it('by default lists the units that need someone first: interrupted, then purging, with no-data units last', () => {
    expect(ids(filterAndSortUnits(fleet, all))).toEqual(['T-3', 'T-2', 'T-10', 'T-1']);
  });

  it('keeps only one depot', () => {
    expect(ids(filterAndSortUnits(fleet, { ...all, depot: 'South yard' }))).toEqual(['T-10']);
  });

  it('keeps only one state, and "none" finds units that have sent nothing yet', () => {
    expect(ids(filterAndSortUnits(fleet, { ...all, state: 'purging' }))).toEqual(['T-2']);
    expect(ids(filterAndSortUnits(fleet, { ...all, state: 'none' }))).toEqual(['T-1']);
  });

  it('searches id and name, ignoring case and surrounding spaces', () => {
    expect(ids(filterAndSortUnits(fleet, { ...all, query: '  reefer ' }))).toEqual(['T-3']);
    expect(ids(filterAndSortUnits(fleet, { ...all, query: 't-1' }))).toEqual(['T-10', 'T-1']); // state order: no data last
  });

  it('sorts ids the way people count (T-2 before T-10), in both directions', () => {
    expect(ids(filterAndSortUnits(fleet, { ...all, sort: { key: 'id', direction: 'asc' } }))).toEqual(['T-1', 'T-2', 'T-3', 'T-10']);
    expect(ids(filterAndSortUnits(fleet, { ...all, sort: { key: 'id', direction: 'desc' } }))).toEqual(['T-10', 'T-3', 'T-2', 'T-1']);
  });

  it('puts units without a reading last whichever way a numeric column is sorted', () => {
    const asc = filterAndSortUnits(fleet, { ...all, sort: { key: 'lastSupplyV', direction: 'asc' } });
    const desc = filterAndSortUnits(fleet, { ...all, sort: { key: 'lastSupplyV', direction: 'desc' } });
    expect(ids(asc)).toEqual(['T-10', 'T-2', 'T-1', 'T-3']);
    expect(ids(desc)).toEqual(['T-2', 'T-10', 'T-1', 'T-3']);
  });

  it('sorts by time in state with the most recent change first when ascending', () => {
    const asc = filterAndSortUnits(fleet, { ...all, sort: { key: 'timeInState', direction: 'asc' } });
    // T-3 and T-10 changed state at the same time, so they keep id order.
    expect(ids(asc)).toEqual(['T-2', 'T-3', 'T-10', 'T-1']);
  });

  it('lists each depot once, in order', () => {
    expect(depotsOf(fleet)).toEqual(['North yard', 'South yard']);
  });
});

describe('filters in the address bar', () => {
  it('round-trips through the query string', () => {
    const f: UnitFilters = { depot: 'North yard', state: 'noContact', query: 'T-4', sort: { key: 'lastAmbientC', direction: 'desc' } };
    expect(readUnitFilters(new URLSearchParams(writeUnitFilters(f).toString()))).toEqual(f);
  });

  it('leaves the default view out of the address, and ignores unknown values', () => {
    expect(writeUnitFilters(all).toString()).toBe('');
    expect(readUnitFilters(new URLSearchParams('state=melting&sort=colour&dir=up'))).toEqual(all);
  });
});
