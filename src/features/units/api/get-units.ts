import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { UnitListSchema, type Unit } from '../types';

export const unitsQueryKey = ['units'] as const;

export async function getUnits(): Promise<Unit[]> {
  const list = parseResponse(UnitListSchema, await api.get('/api/units'), 'unit list');
  const receivedAt = Date.now();
  return list.map((u) => ({ ...u, receivedAt }));
}

export const unitsQueryOptions = () => queryOptions({ queryKey: unitsQueryKey, queryFn: getUnits });

/** The fleet. Pass `refetchInterval: false` while the live feed is writing into this cache. */
export function useUnits({ refetchInterval = 10_000 }: { refetchInterval?: number | false } = {}) {
  return useQuery({ ...unitsQueryOptions(), refetchInterval });
}
