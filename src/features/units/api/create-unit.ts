import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { UnitSchema } from '../types';
import { unitsQueryKey } from './get-units';
import type { CreateUnitInput } from './unit-input';

export async function createUnit(input: CreateUnitInput) {
  return parseResponse(UnitSchema, await api.post('/api/units', input), 'new unit');
}

export function useCreateUnit() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createUnit,
    onSuccess: () => qc.invalidateQueries({ queryKey: unitsQueryKey }),
  });
}
