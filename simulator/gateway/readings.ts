import type { Rng } from '../core/rng';
import { scaleToSystem, supplyV12, type BatteryState } from '../model/electrical';
import type { UnitSpec } from '../model/fleet-types';
import type { Weather } from '../model/weather';

const round2 = (v: number): number => Math.round(v * 100) / 100;

/** The supply input as the gateway measures it (volts, 2 decimals). */
export function readSupply(rng: Rng, unit: UnitSpec, b: BatteryState, running: boolean, isolated: boolean, t: number): number {
  if (isolated) return collapsedSupply(rng, unit);
  const v12 = supplyV12(b, unit.sagVPerH, running, t) + rng.normal(0, running ? 0.04 : 0.015);
  return round2(scaleToSystem(v12, unit.systemVoltage));
}

/** What the hold-up reserve reads as the input collapses after the isolator opens. */
export function collapsedSupply(rng: Rng, unit: UnitSpec): number {
  return round2(scaleToSystem(rng.float(0.6, 3.2), unit.systemVoltage));
}

/** Ambient air, °C to the half degree as a simple sensor reports it; undefined when the unit has none. */
export function readAmbient(rng: Rng, unit: UnitSpec, weather: Weather, t: number): number | undefined {
  if (!unit.hasAmbientSensor) return undefined;
  const v = Math.round((weather(t, unit.depot) + rng.normal(0, 0.3)) * 2) / 2;
  return v === 0 ? 0 : v; // no -0: JSON would write it as 0 anyway
}
