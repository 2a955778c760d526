import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { DriverSchema } from '../../../../shared/api/drivers';

export const driversKey = ['drivers'] as const;

export async function getDrivers() {
  return parseResponse(z.array(DriverSchema), await api.get('/api/drivers'), 'driver list');
}

export function useDrivers() {
  return useQuery(queryOptions({ queryKey: driversKey, queryFn: getDrivers }));
}
