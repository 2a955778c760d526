import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { queryKeys } from '../../../lib/query-keys';
import { rangeBounds, type RangeKey } from '../../../lib/time-range';
import { EpisodeListSchema } from '../types';

export async function getUnitEpisodes(unitId: string, range: RangeKey) {
  return parseResponse(EpisodeListSchema, await api.get('/api/episodes', { query: { unitId, ...rangeBounds(range) } }), 'episode list');
}

/** A unit's purge episodes in a range, newest first; refetched when the feed says they changed. */
export function useUnitEpisodes(unitId: string, range: RangeKey) {
  return useQuery(queryOptions({ queryKey: [...queryKeys.unitEpisodes(unitId), range], queryFn: () => getUnitEpisodes(unitId, range) }));
}
