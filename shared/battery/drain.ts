// Drain of a parked battery with the isolator closed: the rested readings, a straight-line fit of
// state of charge over time, and what that line says about a weekend. Pure, no I/O.
import { stateOfCharge, type SystemVoltage } from './state-of-charge';

/**
 * Readings in the first hours after charging stopped carry surface charge and read high. Waiting
 * about 4 h before trusting an open-circuit reading is common practice, no published source
 * (from memory; some guides ask for 12 h or more, which would leave short parks unjudged).
 */
export const REST_HOURS = 4;
/** A weekend park: Friday evening to Monday morning (as given in issue 6). */
export const WEEKEND_HOURS = 62;
/**
 * The advice's line: below about half charge a lead-acid battery sulphates faster and may not
 * crank a cold diesel; keeping it above 50 % is common practice, no published source (from memory).
 */
export const MIN_WEEKEND_SOC = 50;
/** A fit needs a few rested points over a couple of hours, or one noisy reading decides it (a design choice). */
export const MIN_RESTED_READINGS = 3;
export const MIN_RESTED_SPAN_HOURS = 2;

export interface VoltageReading { ts: number; volts: number }

export interface DrainEstimate {
  restedReadings: number;
  /** Least-squares slope of the rested voltage, volts per hour of the system (negative while draining). */
  voltsPerHour: number;
  /** The fitted line's voltage at charging stop (hour 0); the line is interceptV + voltsPerHour × hours. */
  interceptV: number;
  /** State of charge on the fitted line at the first and last rested reading, percent. */
  socFirst: number;
  socLast: number;
  /** Fall of the state of charge along the fitted line over the rested span, percent per hour (0 when it rises). */
  drainPctPerHour: number;
  /** State of charge on the fitted line 62 h after charging stopped, from the table (so clamped to 0..100). */
  projectedSocAfterWeekend: number;
}

/** Ordinary least squares of y on x; null when x does not vary. */
export function leastSquares(points: readonly { x: number; y: number }[]): { slope: number; intercept: number } | null {
  const n = points.length;
  if (n < 2) return null;
  const mx = points.reduce((s, p) => s + p.x, 0) / n;
  const my = points.reduce((s, p) => s + p.y, 0) / n;
  let sxx = 0;
  let sxy = 0;
  for (const p of points) {
    sxx += (p.x - mx) ** 2;
    sxy += (p.x - mx) * (p.y - my);
  }
  if (sxx === 0) return null;
  const slope = sxy / sxx;
  return { slope, intercept: my - slope * mx };
}

/** Readings at or after the rest time, as hours since charging stopped and volts. */
export function restedReadings(chargeStoppedAt: number, readings: readonly VoltageReading[], restHours = REST_HOURS) {
  return readings.filter((r) => r.ts - chargeStoppedAt >= restHours * 3_600_000).map((r) => ({ x: (r.ts - chargeStoppedAt) / 3_600_000, y: r.volts }));
}

/**
 * The drain of one park, or null when too few rested readings cover too short a time.
 * The line is fitted to the voltage, not to the state of charge: the table clamps at 100 % above
 * 12.65 V (a battery often rests higher for hours) and at 0 % below 11.89 V, and a line through
 * clamped percentages would hide the drain. The percentages are read off the fitted voltages.
 */
export function estimateDrain(chargeStoppedAt: number, readings: readonly VoltageReading[], system: SystemVoltage, restHours = REST_HOURS): DrainEstimate | null {
  const points = restedReadings(chargeStoppedAt, readings, restHours);
  if (points.length < MIN_RESTED_READINGS) return null;
  const first = points[0].x;
  const last = points[points.length - 1].x;
  if (last - first < MIN_RESTED_SPAN_HOURS) return null;
  const fit = leastSquares(points);
  if (!fit) return null;
  const at = (h: number) => stateOfCharge(fit.intercept + fit.slope * h, system);
  const socFirst = at(first);
  const socLast = at(last);
  return {
    restedReadings: points.length,
    voltsPerHour: fit.slope,
    interceptV: fit.intercept,
    socFirst,
    socLast,
    drainPctPerHour: Math.max(0, (socFirst - socLast) / (last - first)),
    projectedSocAfterWeekend: at(WEEKEND_HOURS),
  };
}

export type BatteryAdvice = 'safeOverWeekend' | 'drainTooHigh' | 'notEnoughData';

export const ADVICE_TEXT: Record<BatteryAdvice, string> = {
  safeOverWeekend: 'Safe to leave connected over a weekend.',
  drainTooHigh: 'Drain too high: find the parasitic load or fit a low-voltage disconnect.',
  notEnoughData: `Not enough rested readings yet: a park of at least ${REST_HOURS + MIN_RESTED_SPAN_HOURS} h with the isolator closed is needed.`,
};

/**
 * One advice per unit from its recent parks: the worst projection decides, because one weekend
 * that flattens the battery is what teaches drivers to isolate early (a design choice).
 */
export function adviseFrom(estimates: readonly (DrainEstimate | null)[]): { advice: BatteryAdvice; worstProjectedSoc: number | null } {
  const known = estimates.filter((e): e is DrainEstimate => e !== null);
  if (known.length === 0) return { advice: 'notEnoughData', worstProjectedSoc: null };
  const worst = Math.min(...known.map((e) => e.projectedSocAfterWeekend));
  return { advice: worst < MIN_WEEKEND_SOC ? 'drainTooHigh' : 'safeOverWeekend', worstProjectedSoc: worst };
}
