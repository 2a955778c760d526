import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { queryKeys } from '../../../lib/query-keys';
import { UnitSchema, type Unit } from '../types';

export async function getUnit(id: string): Promise<Unit> {
  const u = parseResponse(UnitSchema, await api.get(`/api/units/${encodeURIComponent(id)}`), 'unit');
  return { ...u, receivedAt: Date.now() };
}

export const unitQueryOptions = (id: string) => queryOptions({ queryKey: queryKeys.unit(id), queryFn: () => getUnit(id) });

/** One unit; the live feed merges its deltas into this cache entry too. */
export function useUnit(id: string) {
  return useQuery(unitQueryOptions(id));
}
