import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { queryKeys } from '../../../lib/query-keys';
import { rangeBounds, type RangeKey } from '../../../lib/time-range';
import { FaultListSchema } from '../types';

export async function getUnitFaults(unitId: string, range: RangeKey) {
  return parseResponse(FaultListSchema, await api.get('/api/faults', { query: { unitId, ...rangeBounds(range) } }), 'fault list');
}

export function useUnitFaults(unitId: string, range: RangeKey) {
  return useQuery(queryOptions({ queryKey: [...queryKeys.unitFaults(unitId), range], queryFn: () => getUnitFaults(unitId, range) }));
}
