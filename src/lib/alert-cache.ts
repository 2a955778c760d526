import type { QueryClient } from '@tanstack/react-query';
import type { AlertView } from '../../shared/realtime/envelope';
import { queryKeys } from './query-keys';

export type AlertStatusFilter = 'open' | 'acknowledged' | 'resolved' | 'active' | 'all';
export interface AlertFilter {
  status: AlertStatusFilter;
  unitId?: string;
}
export const alertsKey = (f: AlertFilter) => [...queryKeys.alerts, f] as const;

export function alertMatches(a: AlertView, f: AlertFilter): boolean {
  if (f.unitId && a.unitId !== f.unitId) return false;
  if (f.status === 'all') return true;
  // The server's `active` = not yet resolved.
  if (f.status === 'active') return a.status !== 'resolved';
  return a.status === f.status;
}

/**
 * Puts a changed alert into every cached alert list: replaced where it is, added on top where it
 * now belongs (lists are newest first), removed where it no longer matches the list's filter.
 */
export function upsertAlert(qc: QueryClient, alert: AlertView) {
  for (const [key, list] of qc.getQueriesData<AlertView[]>({ queryKey: queryKeys.alerts })) {
    if (!list) continue;
    const filter = key[1] as AlertFilter | undefined;
    if (!filter) continue;
    const rest = list.filter((a) => a.id !== alert.id);
    const next = alertMatches(alert, filter)
      ? list.some((a) => a.id === alert.id)
        ? list.map((a) => (a.id === alert.id ? alert : a))
        : [alert, ...rest].sort((x, y) => Date.parse(y.raisedAt) - Date.parse(x.raisedAt))
      : rest;
    qc.setQueryData(key, next);
  }
}
