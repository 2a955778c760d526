import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { CoachingSchema } from '../../../../shared/api/drivers';

export async function getCoaching(driverId: number, weeks: number) {
  return parseResponse(CoachingSchema, await api.get(`/api/drivers/${driverId}/coaching`, { query: { weeks } }), 'coaching view');
}

export function useCoaching(driverId: number, weeks: number) {
  return useQuery(queryOptions({ queryKey: ['drivers', driverId, 'coaching', weeks], queryFn: () => getCoaching(driverId, weeks), enabled: Number.isInteger(driverId) && driverId > 0 }));
}
