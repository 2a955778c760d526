import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { WorkOrderViewSchema } from '../../../../shared/api/work-orders';

export const workOrdersKey = ['work-orders'] as const;

export async function getWorkOrders(status: string) {
  return parseResponse(z.array(WorkOrderViewSchema), await api.get('/api/work-orders', { query: { status } }), 'work order list');
}

export const workOrdersQuery = (status: string) => queryOptions({ queryKey: [...workOrdersKey, 'list', status], queryFn: () => getWorkOrders(status) });

export function useWorkOrders(status: string) {
  return useQuery({ ...workOrdersQuery(status), refetchInterval: 30_000 });
}
