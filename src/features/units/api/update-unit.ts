import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { UnitSchema } from '../types';
import { unitsQueryKey } from './get-units';
import type { UnitProfile } from './unit-input';

export async function updateUnit({ id, profile }: { id: string; profile: Partial<UnitProfile> }) {
  return parseResponse(UnitSchema, await api.patch(`/api/units/${encodeURIComponent(id)}`, profile), 'updated unit');
}

/** Profile changes apply to purges that start after the change (protocol rule 2). */
export function useUpdateUnit() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateUnit,
    onSuccess: () => qc.invalidateQueries({ queryKey: unitsQueryKey }),
  });
}
