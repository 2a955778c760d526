import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { WorkOrderViewSchema } from '../../../../shared/api/work-orders';
import { workOrdersKey } from './get-work-orders';

export const workOrderKey = (id: number) => [...workOrdersKey, 'one', id] as const;

export async function getWorkOrder(id: number) {
  return parseResponse(WorkOrderViewSchema, await api.get(`/api/work-orders/${id}`), 'work order');
}

export const workOrderQuery = (id: number) => queryOptions({ queryKey: workOrderKey(id), queryFn: () => getWorkOrder(id) });

export function useWorkOrder(id: number) {
  return useQuery(workOrderQuery(id));
}
