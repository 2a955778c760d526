import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { queryKeys } from '../../../lib/query-keys';
import { rangeBounds, type RangeKey } from '../../../lib/time-range';
import { ReadingListSchema } from '../types';

export async function getReadings(unitId: string, range: RangeKey) {
  const path = `/api/units/${encodeURIComponent(unitId)}/readings`;
  // About one point per chart pixel column is enough; the server thins to at most this many.
  return parseResponse(ReadingListSchema, await api.get(path, { query: { ...rangeBounds(range), maxPoints: 3000 } }), 'readings');
}

export function useReadings(unitId: string, range: RangeKey) {
  return useQuery(queryOptions({ queryKey: [...queryKeys.unitReadings(unitId), range], queryFn: () => getReadings(unitId, range) }));
}
