import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { BatterySummarySchema, BatteryUnitSchema } from '../../../../shared/api/battery';

export async function getBatteryFleet(days: number, depot?: string) {
  return parseResponse(z.array(BatterySummarySchema), await api.get('/api/battery', { query: { days, depot } }), 'battery summary');
}
export async function getBatteryUnit(unitId: string, days: number) {
  return parseResponse(BatteryUnitSchema, await api.get(`/api/battery/${encodeURIComponent(unitId)}`, { query: { days } }), 'battery detail');
}

export function useBatteryFleet(days: number, depot?: string) {
  return useQuery(queryOptions({ queryKey: ['battery', 'fleet', days, depot ?? ''], queryFn: () => getBatteryFleet(days, depot) }));
}
export function useBatteryUnit(unitId: string | null, days: number) {
  return useQuery(queryOptions({ queryKey: ['battery', 'unit', unitId, days], queryFn: () => getBatteryUnit(unitId!, days), enabled: Boolean(unitId) }));
}
