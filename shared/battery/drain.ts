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
  /** Fitted state of charge at charging stop (hour 0), percent, clamped to 0..100. */
  socAtStart: number;
  /** The fitted line's value at hour 0, unclamped (the line is intercept + slope × hours). */
  interceptPct: number;
  /** Negative while the battery drains; percent of charge per hour. */
  slopePctPerHour: number;
  /** Drain as a positive figure, percent per hour (0 when the fit rises). */
  drainPctPerHour: number;
  /** Fitted state of charge 62 h after charging stopped, clamped to 0..100. */
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

const clamp = (v: number) => Math.min(100, Math.max(0, v));

/** Readings at or after the rest time, as hours since charging stopped and state of charge. */
export function restedPoints(chargeStoppedAt: number, readings: readonly VoltageReading[], system: SystemVoltage, restHours = REST_HOURS) {
  return readings
    .filter((r) => r.ts - chargeStoppedAt >= restHours * 3_600_000)
    .map((r) => ({ x: (r.ts - chargeStoppedAt) / 3_600_000, y: stateOfCharge(r.volts, system) }));
}

/** The drain of one parked period, or null when too few rested readings cover too short a time. */
export function estimateDrain(chargeStoppedAt: number, readings: readonly VoltageReading[], system: SystemVoltage, restHours = REST_HOURS): DrainEstimate | null {
  const points = restedPoints(chargeStoppedAt, readings, system, restHours);
  if (points.length < MIN_RESTED_READINGS) return null;
  const span = points[points.length - 1].x - points[0].x;
  if (span < MIN_RESTED_SPAN_HOURS) return null;
  const fit = leastSquares(points);
  if (!fit) return null;
  return {
    restedReadings: points.length,
    socAtStart: clamp(fit.intercept),
    interceptPct: fit.intercept,
    slopePctPerHour: fit.slope,
    drainPctPerHour: Math.max(0, -fit.slope),
    projectedSocAfterWeekend: clamp(fit.intercept + fit.slope * WEEKEND_HOURS),
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
