import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { AssignmentSchema, DriverSchema, ImportPreviewSchema } from '../../../../shared/api/drivers';
import { driversKey } from './get-drivers';

export const assignmentsKey = ['drivers', 'assignments'] as const;

export async function getAssignments() {
  return parseResponse(z.array(AssignmentSchema), await api.get('/api/drivers/assignments'), 'assignment list');
}
export function useAssignments() {
  return useQuery(queryOptions({ queryKey: assignmentsKey, queryFn: getAssignments }));
}

/** Any change to drivers or assignments also changes who is named on history and reports. */
function useInvalidateAll() {
  const qc = useQueryClient();
  return () => Promise.all([qc.invalidateQueries({ queryKey: driversKey }), qc.invalidateQueries({ queryKey: ['history'] }), qc.invalidateQueries({ queryKey: ['reports'] })]);
}

export function useCreateDriver() {
  const done = useInvalidateAll();
  return useMutation({
    mutationFn: async (input: { code: string; name: string; depot: string | null }) => parseResponse(DriverSchema, await api.post('/api/drivers', input), 'driver'),
    onSuccess: done,
  });
}

export function useCreateAssignment() {
  const done = useInvalidateAll();
  return useMutation({
    mutationFn: async (input: { driverId: number; unitId: string; from: string; to: string | null }) => parseResponse(AssignmentSchema, await api.post('/api/drivers/assignments', input), 'assignment'),
    onSuccess: done,
  });
}

export function useDeleteAssignment() {
  const done = useInvalidateAll();
  return useMutation({ mutationFn: (id: number) => api.delete(`/api/drivers/assignments/${id}`), onSuccess: done });
}

export function useImportAssignments() {
  const done = useInvalidateAll();
  return useMutation({
    mutationFn: async (input: { csv: string; commit: boolean }) => parseResponse(ImportPreviewSchema, await api.post('/api/drivers/assignments/import', input), 'import preview'),
    onSuccess: (r) => (r.committed ? done() : undefined),
  });
}
