import { useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { AlertViewSchema } from '../../../../shared/realtime/envelope';

/** Alerts not yet resolved: what a planner opens work orders from. */
export async function getActiveAlerts() {
  return parseResponse(z.array(AlertViewSchema), await api.get('/api/alerts', { query: { status: 'active', limit: 200 } }), 'alert list');
}

export function useActiveAlerts() {
  return useQuery({ queryKey: ['alerts', 'active', 'for-work-orders'], queryFn: getActiveAlerts });
}
