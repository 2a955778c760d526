import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { session } from '../../../lib/session';
import { toApiError } from '../../../lib/api-error';
import { RosterCommitResultSchema, RosterPreviewSchema } from '../../../../shared/api/roster';

export async function previewRoster(csv: string) {
  return parseResponse(RosterPreviewSchema, await api.post('/api/roster/preview', { csv }), 'roster preview');
}

export async function commitRoster(csv: string) {
  return parseResponse(RosterCommitResultSchema, await api.post('/api/roster/commit', { csv }), 'roster import');
}

export const usePreviewRoster = () => useMutation({ mutationFn: previewRoster });

/** A commit changes the units and gateways lists. */
export function useCommitRoster() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: commitRoster,
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: ['units'] }), qc.invalidateQueries({ queryKey: ['gateways'] })]),
  });
}

/** The template comes from the server (signed in), handed to the browser as a download. */
export async function downloadTemplate() {
  const res = await fetch('/api/roster/template', { headers: { Authorization: `Bearer ${session.get()?.token ?? ''}` } });
  if (!res.ok) throw toApiError(res.status, res.statusText, await res.json().catch(() => undefined));
  saveText('fleet-roster-template.csv', await res.text());
}

export function saveText(fileName: string, text: string) {
  const url = URL.createObjectURL(new Blob([text], { type: 'text/csv;charset=utf-8' }));
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}
