import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { AlertViewSchema } from '../../../../shared/realtime/envelope';
import { alertsKey, type AlertFilter } from '../../../lib/alert-cache';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';

const AlertListSchema = z.array(AlertViewSchema);

export async function getAlerts(f: AlertFilter) {
  const query = { status: f.status === 'all' ? undefined : f.status, unitId: f.unitId, limit: 500 };
  return parseResponse(AlertListSchema, await api.get('/api/alerts', { query }), 'alert list');
}

export const alertsQueryOptions = (f: AlertFilter) => queryOptions({ queryKey: alertsKey(f), queryFn: () => getAlerts(f) });

/** Alerts newest first; the live feed upserts changed alerts into every cached list. */
export function useAlerts(f: AlertFilter) {
  return useQuery(alertsQueryOptions(f));
}
