import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { ProvisionedGatewaySchema, type ProvisionGatewayInput } from '../types';
import { gatewaysQueryKey } from './get-gateways';

export async function provisionGateway(input: ProvisionGatewayInput) {
  return parseResponse(ProvisionedGatewaySchema, await api.post('/api/gateways', input), 'new gateway');
}

/** A new gateway replaces (and revokes) the unit's previous one; the unit list shows the new id. */
export function useProvisionGateway() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: provisionGateway,
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: gatewaysQueryKey }), qc.invalidateQueries({ queryKey: ['units'] })]),
  });
}
