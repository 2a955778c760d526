import { useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { TechnicianSchema } from '../../../../shared/api/work-orders';

export async function getTechnicians() {
  return parseResponse(z.array(TechnicianSchema), await api.get('/api/work-orders/technicians'), 'technician list');
}

export function useTechnicians(enabled = true) {
  return useQuery({ queryKey: ['work-orders', 'technicians'], queryFn: getTechnicians, enabled });
}
