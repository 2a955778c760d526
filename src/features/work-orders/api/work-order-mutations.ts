import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { WorkOrderViewSchema, type CheckRecord, type WorkOrderClose, type WorkOrderCreate, type WorkOrderView } from '../../../../shared/api/work-orders';
import { workOrderKey } from './get-work-order';
import { workOrdersKey } from './get-work-orders';
import { rawFetch } from '../lib/raw-fetch';

const asOrder = (data: unknown) => parseResponse(WorkOrderViewSchema, data, 'work order');

/** Every change answers with the whole order: put it in the cache, and refresh the lists. */
function useOrderMutation<I>(fn: (input: I) => Promise<WorkOrderView>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: (order) => {
      qc.setQueryData(workOrderKey(order.id), order);
      return qc.invalidateQueries({ queryKey: [...workOrdersKey, 'list'] });
    },
  });
}

export const useCreateWorkOrder = () => useOrderMutation(async (input: WorkOrderCreate) => asOrder(await api.post('/api/work-orders', input)));
export const useAssignWorkOrder = (id: number) => useOrderMutation(async (assigneeId: number) => asOrder(await api.post(`/api/work-orders/${id}/assign`, { assigneeId })));
export const useRecordCheck = (id: number) => useOrderMutation(async (check: CheckRecord) => asOrder(await api.post(`/api/work-orders/${id}/checks`, check)));
export const useCloseWorkOrder = (id: number) => useOrderMutation(async (input: WorkOrderClose) => asOrder(await api.post(`/api/work-orders/${id}/close`, input)));
export const useUploadPhoto = (id: number) =>
  useOrderMutation(async (file: File) => {
    const body = new FormData();
    body.append('photo', file);
    const res = await rawFetch(`/api/work-orders/${id}/photos`, { method: 'POST', body });
    return asOrder(await res.json());
  });
