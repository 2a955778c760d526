import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { gatewaysQueryKey } from './get-gateways';

export async function revokeGateway(gatewayId: string): Promise<void> {
  await api.delete(`/api/gateways/${encodeURIComponent(gatewayId)}`);
}

export function useRevokeGateway() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: revokeGateway,
    onSettled: () => Promise.all([qc.invalidateQueries({ queryKey: gatewaysQueryKey }), qc.invalidateQueries({ queryKey: ['units'] })]),
  });
}
