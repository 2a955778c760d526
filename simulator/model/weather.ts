import { createRng } from '../core/rng';
import { DAY, HOUR, dayIndexOf } from '../core/time';

export interface WeatherOptions {
  seed: string;
  /** Daily mean at the start, °C; null = follow the season of the date. */
  meanC: number | null;
  /** Half the day/night swing, °C. */
  swingC: number;
  /** A cold air mass: the air never warms above this, °C. */
  capC?: number;
}

/** Day-of-year seasonal mean for a temperate inland site (invented curve: about 1 °C in mid-January, 17 °C in mid-July). */
function seasonalMean(ms: number): number {
  const start = Date.UTC(new Date(ms).getUTCFullYear(), 0, 1);
  const doy = (ms - start) / DAY;
  return 9 - 8 * Math.cos((2 * Math.PI * (doy - 15)) / 365);
}

/**
 * Outside air temperature at a depot, °C: a daily cosine with its low near 04:00 and its high
 * near 15:00 (typical of clear-sky days, from memory), plus a random offset per day and depot.
 */
export function createWeather(opts: WeatherOptions) {
  const dayOffsets = new Map<string, number>();
  const offsetFor = (day: number, depot: string): number => {
    const key = `${day}/${depot}`;
    let v = dayOffsets.get(key);
    if (v === undefined) {
      const r = createRng(`${opts.seed}/weather/${key}`);
      v = r.normal(0, 1.2);
      dayOffsets.set(key, v);
    }
    return v;
  };
  return (ms: number, depot: string): number => {
    const mean = opts.meanC ?? seasonalMean(ms);
    const hour = (ms % DAY) / HOUR;
    // Shape: peak at 15:00, trough 11 h earlier (asymmetric curve approximated by a shifted cosine).
    const phase = hour >= 4 && hour < 15 ? ((hour - 4) / 11) * Math.PI : ((hour < 4 ? hour + 24 : hour) - 15) / 13 * Math.PI + Math.PI;
    const diurnal = -Math.cos(phase) * opts.swingC;
    const d = dayIndexOf(ms);
    const t = (ms - d * DAY) / DAY;
    const offset = offsetFor(d, depot) * (1 - t) + offsetFor(d + 1, depot) * t;
    const v = mean + diurnal + offset;
    return opts.capC === undefined ? v : Math.min(v, opts.capC);
  };
}
export type Weather = ReturnType<typeof createWeather>;
