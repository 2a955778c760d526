// Query keys shared by the pages and by the live feed that writes into the same cache.
// A unit's own reads sit under ['units', id, ...] so invalidating ['units', id] refreshes all of them.
export const queryKeys = {
  units: ['units'] as const,
  unit: (id: string) => ['units', id] as const,
  unitTimeline: (id: string) => ['units', id, 'timeline'] as const,
  unitReadings: (id: string) => ['units', id, 'readings'] as const,
  episodes: ['episodes'] as const,
  unitEpisodes: (unitId: string) => ['episodes', unitId] as const,
  faults: ['faults'] as const,
  unitFaults: (unitId: string) => ['faults', unitId] as const,
  alerts: ['alerts'] as const,
  switchPage: (token: string) => ['switch', token] as const,
  switchSheet: ['switch-sheet'] as const,
};
