import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api, ApiError } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';

export const DepotSchema = z.object({ name: z.string(), latitude: z.number().nullable(), longitude: z.number().nullable(), unitCount: z.number() });
export type Depot = z.infer<typeof DepotSchema>;
const ForecastSchema = z.object({ depot: z.string(), fetchedAt: z.string(), lowC: z.number(), lowAt: z.string(), hours: z.array(z.object({ at: z.string(), c: z.number() })) });
const WarningSchema = z.object({ alertId: z.number(), unitId: z.string(), depot: z.string(), lowC: z.number(), lowAt: z.string(), actBy: z.string(), status: z.string() });
export type DepotForecast = z.infer<typeof ForecastSchema>;
export type ForecastWarning = z.infer<typeof WarningSchema>;

export const useDepots = () => useQuery({ queryKey: ['depots'], queryFn: async () => parseResponse(z.array(DepotSchema), await api.get('/api/depots'), 'depot list') });
export const useForecasts = () => useQuery({ queryKey: ['forecast'], queryFn: async () => parseResponse(z.array(ForecastSchema), await api.get('/api/forecast'), 'forecast'), refetchInterval: 60_000 });
export const useForecastWarnings = () =>
  useQuery({ queryKey: ['forecast', 'warnings'], queryFn: async () => parseResponse(z.array(WarningSchema), await api.get('/api/forecast/warnings'), 'forecast warnings'), refetchInterval: 60_000 });

export function useSetDepotLocation() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (d: { name: string; latitude: number; longitude: number }) => {
      if (!Number.isFinite(d.latitude) || Math.abs(d.latitude) > 90) throw new ApiError(0, 'invalid', 'Latitude must be a number from −90 to 90.');
      if (!Number.isFinite(d.longitude) || Math.abs(d.longitude) > 180) throw new ApiError(0, 'invalid', 'Longitude must be a number from −180 to 180.');
      return parseResponse(DepotSchema, await api.request(`/api/depots/${encodeURIComponent(d.name)}`, { method: 'PUT', body: { latitude: d.latitude, longitude: d.longitude } }), 'depot');
    },
    onSuccess: () => qc.invalidateQueries({ queryKey: ['depots'] }),
  });
}

export function useRefreshForecast() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async () => api.post('/api/forecast/refresh'),
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: ['forecast'] }), qc.invalidateQueries({ queryKey: ['alerts'] })]),
  });
}
