// A local stand-in for a hosted forecast API, answering the same request and response shape as
// Open-Meteo's documented forecast endpoint (from memory):
//   GET /v1/forecast?latitude=&longitude=&hourly=temperature_2m&forecast_days=2&timezone=UTC
//   -> { latitude, longitude, timezone: "UTC", hourly_units: { time: "iso8601", temperature_2m: "°C" },
//        hourly: { time: ["2026-12-02T00:00", ...], temperature_2m: [-3.1, ...] } }
// Temperatures are invented: a daily swing around a latitude-dependent mean, or a series a test set.
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { z } from 'zod';

const Query = z.object({
  latitude: z.coerce.number().min(-90).max(90),
  longitude: z.coerce.number().min(-180).max(180),
  hourly: z.literal('temperature_2m'),
  forecast_days: z.coerce.number().int().min(1).max(16).default(7),
  timezone: z.string().default('GMT'),
});

const key = (lat: number, lon: number) => `${lat.toFixed(4)},${lon.toFixed(4)}`;

/** Invented weather: colder further from the equator, coldest around 05:00 local solar time. */
export function inventedTemperatureC(lat: number, lon: number, at: Date): number {
  const mean = 14 - 0.45 * Math.abs(lat);
  const solarHour = (at.getUTCHours() + lon / 15 + 24) % 24;
  const swing = 5 * Math.cos(((solarHour - 15) / 24) * 2 * Math.PI);
  return Math.round((mean + swing) * 10) / 10;
}

export async function startForecastFake(opts: { host: string; port: number; now?: () => number }) {
  const series = new Map<string, number[]>();
  let requests = 0;
  const now = opts.now ?? Date.now;
  const send = (res: ServerResponse, status: number, body: unknown) => {
    res.writeHead(status, { 'Content-Type': 'application/json' });
    res.end(JSON.stringify(body));
  };
  const handle = (req: IncomingMessage, res: ServerResponse) => {
    const url = new URL(req.url ?? '/', 'http://fake');
    if (req.method !== 'GET' || url.pathname !== '/v1/forecast') return send(res, 404, { error: true, reason: 'Not found' });
    const q = Query.safeParse(Object.fromEntries(url.searchParams));
    if (!q.success) return send(res, 400, { error: true, reason: q.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ') });
    requests += 1;
    const start = new Date(now());
    start.setUTCMinutes(0, 0, 0);
    start.setUTCHours(0);
    const hours = q.data.forecast_days * 24;
    const fixed = series.get(key(q.data.latitude, q.data.longitude));
    const time: string[] = [];
    const temps: number[] = [];
    for (let h = 0; h < hours; h++) {
      const at = new Date(start.getTime() + h * 3600_000);
      time.push(at.toISOString().slice(0, 16));
      temps.push(fixed ? fixed[Math.min(h, fixed.length - 1)] : inventedTemperatureC(q.data.latitude, q.data.longitude, at));
    }
    send(res, 200, {
      latitude: q.data.latitude, longitude: q.data.longitude, timezone: 'UTC', timezone_abbreviation: 'UTC', utc_offset_seconds: 0,
      hourly_units: { time: 'iso8601', temperature_2m: '°C' }, hourly: { time, temperature_2m: temps },
    });
  };
  const server = createServer(handle);
  await new Promise<void>((res, rej) => {
    server.once('error', rej);
    server.listen(opts.port, opts.host, () => res());
  });
  const port = (server.address() as AddressInfo).port;
  return {
    port,
    url: `http://${opts.host}:${port}`,
    /** Hourly temperatures from 00:00 UTC today for one place (the last value repeats); null = invented again. */
    setSeries(lat: number, lon: number, temps: number[] | null) {
      if (temps) series.set(key(lat, lon), temps);
      else series.delete(key(lat, lon));
    },
    requests: () => requests,
    close: () => new Promise<void>((res) => { server.close(() => res()); server.closeAllConnections(); }),
  };
}
