import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { GatewaySchema } from '../types';

export const gatewaysQueryKey = ['gateways'] as const;

export async function getGateways() {
  return parseResponse(z.array(GatewaySchema), await api.get('/api/gateways'), 'gateway list');
}

export const gatewaysQueryOptions = () => queryOptions({ queryKey: gatewaysQueryKey, queryFn: getGateways });

/** Polled slowly so "connected" stays roughly current. */
export function useGateways() {
  return useQuery({ ...gatewaysQueryOptions(), refetchInterval: 15_000 });
}
