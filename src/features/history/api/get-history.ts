import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { HistoryEpisodeRowSchema, HistoryFaultRowSchema, pageOf } from '../../../../shared/api/history-query';
import { historyQuery, type HistoryFilters } from '../lib/history-params';

const EpisodePage = pageOf(HistoryEpisodeRowSchema);
const FaultPage = pageOf(HistoryFaultRowSchema);

export async function getHistoryEpisodes(f: HistoryFilters) {
  return parseResponse(EpisodePage, await api.get('/api/history/episodes', { query: historyQuery(f) }), 'episode history');
}
export async function getHistoryFaults(f: HistoryFilters) {
  return parseResponse(FaultPage, await api.get('/api/history/faults', { query: historyQuery(f) }), 'fault history');
}

/** One page of the filtered history; the previous page stays on screen while the next loads. */
export function useHistoryEpisodes(f: HistoryFilters) {
  return useQuery(queryOptions({ queryKey: ['history', 'episodes', historyQuery(f)], queryFn: () => getHistoryEpisodes(f), placeholderData: keepPreviousData, enabled: f.view === 'episodes' }));
}
export function useHistoryFaults(f: HistoryFilters) {
  return useQuery(queryOptions({ queryKey: ['history', 'faults', historyQuery(f)], queryFn: () => getHistoryFaults(f), placeholderData: keepPreviousData, enabled: f.view === 'faults' }));
}
