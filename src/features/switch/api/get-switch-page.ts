import { useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { queryKeys } from '../../../lib/query-keys';
import { SwitchPageSchema, type SwitchPage } from '../types';

export async function getSwitchPage(token: string): Promise<SwitchPage> {
  const page = parseResponse(SwitchPageSchema, await api.get(`/api/switch/${encodeURIComponent(token)}`), 'switch page');
  return { ...page, receivedAt: Date.now() };
}

/** One unit's light, read without sign-in; the switch feed keeps it current. */
export function useSwitchPage(token: string) {
  return useQuery({ queryKey: queryKeys.switchPage(token), queryFn: () => getSwitchPage(token), retry: false, staleTime: Infinity });
}
