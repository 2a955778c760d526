// The supply seen at the gateway's input, downstream of the battery isolator.
// Figures are typical lead-acid values (from memory): a charging system regulates about
// 14.2 V (28.4 V on 24 V), a full battery rests near 12.7 V (25.4 V), and after the engine
// stops the surface charge decays over some tens of minutes.
import { HOUR, MINUTE } from '../core/time';

export const CHARGE_V_12 = 14.2;
export const FULL_REST_V_12 = 12.72;
const SURFACE_V_12 = 0.35;
const SURFACE_TAU_MS = 25 * MINUTE;

export interface BatteryState {
  /** Resting voltage, 12 V-equivalent. */
  restV: number;
  /** When the engine last stopped (ms), null while running. */
  stoppedAt: number | null;
  startedAt: number | null;
}

export function newBattery(restV: number): BatteryState {
  return { restV, stoppedAt: null, startedAt: null };
}

/** Resting voltage after `parkedMs` of parasitic drain. */
export function restAfter(restV: number, sagVPerH: number, parkedMs: number): number {
  return Math.max(11.6, restV - sagVPerH * (parkedMs / HOUR));
}

/** Supply voltage (12 V-equivalent, before scaling to the system) at time `t`. */
export function supplyV12(b: BatteryState, sagVPerH: number, running: boolean, t: number): number {
  if (running) {
    const since = b.startedAt === null ? Infinity : t - b.startedAt;
    // Regulator ramps up in the first minute after start.
    return since < MINUTE ? 13.5 + (CHARGE_V_12 - 13.5) * (since / MINUTE) : CHARGE_V_12;
  }
  const parked = b.stoppedAt === null ? 0 : t - b.stoppedAt;
  return restAfter(b.restV, sagVPerH, parked) + SURFACE_V_12 * Math.exp(-parked / SURFACE_TAU_MS);
}

/** After a drive, the battery has recovered toward full (about an hour of charging brings it back, from memory). */
export function rechargeAfter(restV: number, drivenMs: number): number {
  return Math.min(FULL_REST_V_12, restV + (FULL_REST_V_12 - restV) * Math.min(1, drivenMs / HOUR));
}

export const scaleToSystem = (v12: number, systemVoltage: 12 | 24): number => (systemVoltage === 24 ? v12 * 2 : v12);
