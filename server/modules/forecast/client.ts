// The forecast client: Open-Meteo's documented forecast request and response (from memory), against
// FORECAST_URL (by default the local fake; the real host is never called from here).
import { z } from 'zod';

const ForecastResponseSchema = z.object({
  hourly: z.object({
    time: z.array(z.string().regex(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}$/, 'hourly.time must be ISO 8601 local times (YYYY-MM-DDTHH:MM)')),
    temperature_2m: z.array(z.number().nullable()),
  }),
});

export interface HourlyTemperature {
  at: Date;
  c: number;
}

// Three days, not two: the request starts at 00:00 UTC today, so two days would end before now + 48 h.
export const FORECAST_DAYS = 3;

export async function fetchHourlyTemperatures(baseUrl: string, latitude: number, longitude: number, timeoutMs = 10_000): Promise<HourlyTemperature[]> {
  const url = new URL('/v1/forecast', baseUrl);
  url.search = new URLSearchParams({
    latitude: String(latitude), longitude: String(longitude), hourly: 'temperature_2m', forecast_days: String(FORECAST_DAYS), timezone: 'UTC',
  }).toString();
  const res = await fetch(url, { signal: AbortSignal.timeout(timeoutMs), headers: { Accept: 'application/json' } });
  if (!res.ok) throw new Error(`forecast service answered ${res.status}: ${(await res.text()).slice(0, 200)}`);
  const parsed = ForecastResponseSchema.safeParse(await res.json());
  if (!parsed.success) throw new Error(`forecast response has an unexpected shape: ${parsed.error.issues[0]?.path.join('.')}: ${parsed.error.issues[0]?.message}`);
  const { time, temperature_2m } = parsed.data.hourly;
  if (time.length !== temperature_2m.length) throw new Error(`forecast response has ${time.length} times but ${temperature_2m.length} temperatures`);
  // timezone=UTC: the local times are UTC times.
  return time.flatMap((t, i) => (temperature_2m[i] === null ? [] : [{ at: new Date(`${t}:00Z`), c: temperature_2m[i] as number }]));
}
