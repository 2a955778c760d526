import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { queryKeys } from '../../../lib/query-keys';
import { rangeBounds, type RangeKey } from '../../../lib/time-range';
import { TimelineSchema } from '../types';

export async function getTimeline(unitId: string, range: RangeKey) {
  const path = `/api/units/${encodeURIComponent(unitId)}/timeline`;
  return parseResponse(TimelineSchema, await api.get(path, { query: rangeBounds(range) }), 'timeline');
}

/** Key, power and contact events, newest first. */
export function useTimeline(unitId: string, range: RangeKey) {
  return useQuery(queryOptions({ queryKey: [...queryKeys.unitTimeline(unitId), range], queryFn: () => getTimeline(unitId, range) }));
}
