import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { queryKeys } from '../../../lib/query-keys';
import { IssuedSwitchPageSchema, SwitchSheetSchema } from '../types';

export async function getSwitchSheet(depot?: string) {
  return parseResponse(SwitchSheetSchema, await api.get('/api/switch-pages', { query: { depot } }), 'switch sheet');
}

/** Units that have a switch page (admin), with their QR codes. */
export function useSwitchSheet(depot?: string, enabled = true) {
  return useQuery({ queryKey: [...queryKeys.switchSheet, depot ?? null], queryFn: () => getSwitchSheet(depot), enabled });
}

export async function issueSwitchPage(unitId: string) {
  return parseResponse(IssuedSwitchPageSchema, await api.post(`/api/switch-pages/${encodeURIComponent(unitId)}`), 'issued switch page');
}

/** Issues or reissues a unit's switch page; the old link stops at once. */
export function useIssueSwitchPage() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: issueSwitchPage, onSuccess: () => qc.invalidateQueries({ queryKey: queryKeys.switchSheet }) });
}

export function useRevokeSwitchPage() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (unitId: string) => api.delete(`/api/switch-pages/${encodeURIComponent(unitId)}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: queryKeys.switchSheet }),
  });
}

/** Issues pages one after another (not all at once: each writes the audit log). */
export function useIssueMany() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (unitIds: string[]) => {
      for (const id of unitIds) await issueSwitchPage(id);
      return unitIds.length;
    },
    onSettled: () => qc.invalidateQueries({ queryKey: queryKeys.switchSheet }),
  });
}
