import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { UnitListSchema } from '../types';

export const unitsQueryKey = ['units'] as const;

export async function getUnits() {
  return parseResponse(UnitListSchema, await api.get('/api/units'), 'unit list');
}

export const unitsQueryOptions = () => queryOptions({ queryKey: unitsQueryKey, queryFn: getUnits });

/** The fleet. Polls every 10 s until the live feed writes into this cache. */
export function useUnits({ refetchInterval = 10_000 }: { refetchInterval?: number | false } = {}) {
  return useQuery({ ...unitsQueryOptions(), refetchInterval });
}
